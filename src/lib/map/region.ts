import { cellToBoundary, latLngToCell } from 'h3-js';
import type { LevelKey } from '$lib/engine';
import { LEVEL_KEYS } from '$lib/domain';

/** A cell (or a cell's week) is shown only when at least this many farms stand behind it. */
export const FARM_FLOOR = 3;
/**
 * The one H3 resolution of the overview, 5 (cells of about 250 km², edge about 9.9 km, from h3-js
 * getHexagonEdgeLengthAvg): coarse enough that the demo valley's busiest cell holds 4 of its
 * 6 farms, fine enough to show a front of first flights moving across a county.
 */
export const REGION_RESOLUTION = 5;

export interface RegionInputRow {
	kind: 'farm' | 'level' | 'trap';
	week: string | null;
	farmId: number;
	lat: number;
	lon: number;
	level: LevelKey | null;
	blocks: number;
	alates: number | null;
	trapDays: number | null;
	traps: number;
}

export type LevelCounts = Record<LevelKey, number>;

export interface CellWeek {
	week: string;
	/** Blocks at each level as of the week's end; null when under FARM_FLOOR farms were assessed. */
	levels: LevelCounts | null;
	/** The level of the middle block (upper median), in LEVEL_KEYS order. */
	median: LevelKey | null;
	/** Winged aphids per trap per 7 days; null when under FARM_FLOOR farms' traps were read. */
	alatesPerTrapWeek: number | null;
	traps: number;
}

export interface RegionCell {
	type: 'Feature';
	geometry: { type: 'Polygon'; coordinates: [number, number][][] };
	properties: { cell: string; farms: number; weeks: CellWeek[] };
}

export interface RegionOverview {
	type: 'FeatureCollection';
	resolution: number;
	floor: number;
	weeks: string[];
	withheldCells: number;
	features: RegionCell[];
}

const emptyCounts = (): LevelCounts => ({ calm: 0, stirring: 0, action: 0, severe: 0 });

export function medianLevel(c: LevelCounts): LevelKey | null {
	const total = LEVEL_KEYS.reduce((s, k) => s + c[k], 0);
	if (!total) return null;
	let seen = 0;
	for (const k of LEVEL_KEYS) {
		seen += c[k];
		if (seen > total / 2) return k;
	}
	return 'severe';
}

/**
 * Aggregates farm rows into H3 cells. Only cells holding FARM_FLOOR or more farms survive, and
 * inside them a week's levels or trap figure only when that many farms contributed to it.
 * Nothing that names or locates a farm leaves this function: cell index, outline and counts.
 */
export function aggregateRegion(
	rows: RegionInputRow[],
	weeks: string[],
	resolution = REGION_RESOLUTION
): RegionOverview {
	const cellOfFarm = new Map<number, string>();
	const farmsOfCell = new Map<string, Set<number>>();
	for (const r of rows) {
		if (cellOfFarm.has(r.farmId)) continue;
		const cell = latLngToCell(r.lat, r.lon, resolution);
		cellOfFarm.set(r.farmId, cell);
		if (!farmsOfCell.has(cell)) farmsOfCell.set(cell, new Set());
		farmsOfCell.get(cell)!.add(r.farmId);
	}
	type Acc = {
		counts: LevelCounts;
		levelFarms: Set<number>;
		alates: number;
		days: number;
		traps: number;
		trapFarms: Set<number>;
	};
	const acc = new Map<string, Acc>();
	const get = (cell: string, week: string) => {
		const key = `${cell}|${week}`;
		let a = acc.get(key);
		if (!a) {
			a = {
				counts: emptyCounts(),
				levelFarms: new Set(),
				alates: 0,
				days: 0,
				traps: 0,
				trapFarms: new Set()
			};
			acc.set(key, a);
		}
		return a;
	};
	for (const r of rows) {
		if (r.kind === 'farm' || !r.week) continue;
		const a = get(cellOfFarm.get(r.farmId)!, r.week);
		if (r.kind === 'level' && r.level) {
			a.counts[r.level] += r.blocks;
			a.levelFarms.add(r.farmId);
		} else if (r.kind === 'trap' && r.alates != null && r.trapDays) {
			a.alates += r.alates;
			a.days += r.trapDays;
			a.traps += r.traps;
			a.trapFarms.add(r.farmId);
		}
	}
	const features: RegionCell[] = [];
	let withheldCells = 0;
	for (const [cell, farms] of [...farmsOfCell].sort(([a], [b]) => a.localeCompare(b))) {
		if (farms.size < FARM_FLOOR) {
			withheldCells++;
			continue;
		}
		const ring = cellToBoundary(cell, true) as [number, number][];
		features.push({
			type: 'Feature',
			geometry: { type: 'Polygon', coordinates: [ring] },
			properties: {
				cell,
				farms: farms.size,
				weeks: weeks.map((week) => {
					const a = acc.get(`${cell}|${week}`);
					const levels = a && a.levelFarms.size >= FARM_FLOOR ? a.counts : null;
					const trapsOk = a && a.trapFarms.size >= FARM_FLOOR;
					return {
						week,
						levels,
						median: levels ? medianLevel(levels) : null,
						alatesPerTrapWeek: trapsOk ? Math.round((a.alates / a.days) * 70) / 10 : null,
						traps: trapsOk ? a.traps : 0
					};
				})
			}
		});
	}
	return {
		type: 'FeatureCollection',
		resolution,
		floor: FARM_FLOOR,
		weeks,
		withheldCells,
		features
	};
}

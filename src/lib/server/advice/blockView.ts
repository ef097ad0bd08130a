import { QueryTypes } from 'sequelize';
import {
	assessBlock,
	cumulativeDd,
	dayNumber,
	EngineInputError,
	type Assessment
} from '$lib/engine';
import { db } from '../db';
import { engineInput } from '../assessments';
import type { BlockWithParts } from './scope';

export interface VisitRow {
	id: number;
	visitedOn: string;
	scout: string;
	bbch: number | null;
	mode: string;
	units: number;
	mummies: number;
	predators: number;
	notes: string | null;
	photos: { id: number; caption: string | null }[];
}

export interface DegreeDays {
	base: number;
	upper: number | null;
	/** Accumulated from the first visit to the last weather day. */
	sinceFirstVisit: number | null;
	last7PerDay: number | null;
	lastDay: string;
	atVisits: { date: string; dd: number | null }[];
}

const isoDay = (v: unknown) => (v instanceof Date ? v.toISOString().slice(0, 10) : String(v));

/** The visits of a block with scout names, counts of units and their photos (two queries). */
async function visitsOf(blockId: number): Promise<VisitRow[]> {
	const [visits, photos] = await Promise.all([
		db().query<Omit<VisitRow, 'photos'>>(
			`SELECT v.id, v.visited_on AS visitedOn, u.name AS scout, v.bbch, v.mode, v.mummies,
			        v.ladybeetles + v.lacewings + v.hoverflies + v.other_predators AS predators, v.notes,
			        (SELECT COUNT(*) FROM visit_counts c WHERE c.visit_id = v.id) AS units
			   FROM visits v JOIN users u ON u.id = v.scout_id
			  WHERE v.block_id = ? ORDER BY v.visited_on DESC, v.id DESC`,
			{ replacements: [blockId], type: QueryTypes.SELECT }
		),
		db().query<{ id: number; visitId: number; caption: string | null }>(
			`SELECT p.id, p.visit_id AS visitId, p.caption FROM photos p
			   JOIN visits v ON v.id = p.visit_id WHERE v.block_id = ? ORDER BY p.id`,
			{ replacements: [blockId], type: QueryTypes.SELECT }
		)
	]);
	return visits.map((v) => ({
		...v,
		visitedOn: isoDay(v.visitedOn),
		units: Number(v.units),
		predators: Number(v.predators),
		photos: photos.filter((p) => p.visitId === v.id).map((p) => ({ id: p.id, caption: p.caption }))
	}));
}

/** Degree-days above the pest's base temperature, single-sine (see the engine). */
function degreeDays(input: Awaited<ReturnType<typeof engineInput>>['input']): DegreeDays | null {
	const w = input.weather;
	if (!w || !w.length) return null;
	const base = input.pest.baseTempC.value;
	const upper = input.pest.upperTempC?.value;
	try {
		const s = cumulativeDd(w, base, upper);
		const at = (date: string) => {
			const i = dayNumber(date, 'date') - s.firstDay;
			return i >= 0 && i < s.cumulative.length ? s.cumulative[i] : null;
		};
		const first = input.visits[0]?.date;
		const endIdx = s.cumulative.length - 1;
		const start = first ? at(first) : null;
		return {
			base,
			upper: upper ?? null,
			sinceFirstVisit: start === null ? null : s.cumulative[endIdx] - start,
			last7PerDay: endIdx >= 7 ? (s.cumulative[endIdx] - s.cumulative[endIdx - 7]) / 7 : null,
			lastDay: w[w.length - 1].date,
			atVisits: input.visits.map((v) => ({ date: v.date, dd: at(v.date) }))
		};
	} catch (e) {
		if (e instanceof EngineInputError) return null;
		throw e;
	}
}

/** Everything the block page shows, computed as of today. */
export async function blockView(block: BlockWithParts, today: string) {
	const [{ input }, visits] = await Promise.all([engineInput(block.id, today), visitsOf(block.id)]);
	let assessment: Assessment | null = null;
	let engineError: string | null = null;
	try {
		assessment = assessBlock(input);
	} catch (e) {
		if (!(e instanceof EngineInputError)) throw e;
		engineError = e.message;
	}
	return {
		block: {
			id: block.id,
			name: block.name,
			variety: block.variety,
			areaHa: block.areaHa,
			plantsPerHa: block.plantsPerHa,
			plantingDate: block.plantingDate,
			expectedHarvest: block.expectedHarvest,
			rescoutDays: block.rescoutDays,
			expectedYieldKgHa: block.expectedYieldKgHa,
			pricePerKg: block.pricePerKg,
			level: block.currentLevel,
			reason: block.currentReason,
			lastVisitOn: block.lastVisitOn,
			boundary: block.boundary,
			centroid: [block.centroidLat, block.centroidLon] as [number, number],
			farm: { id: block.farm.id, name: block.farm.name, growerId: block.farm.growerId },
			crop: { code: block.crop.code, name: block.crop.name },
			pest: {
				code: block.pest.code,
				name: block.pest.name,
				scientificName: block.pest.scientificName
			}
		},
		input,
		assessment,
		engineError,
		degreeDays: degreeDays(input),
		visits
	};
}

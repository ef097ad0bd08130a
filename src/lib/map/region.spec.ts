import { describe, expect, it } from 'vitest';
import { latLngToCell } from 'h3-js';
import { aggregateRegion, medianLevel, type RegionInputRow } from './region';
import { graticule, graticuleStep } from './context';
import { weeksBetween } from './weeks';

const farm = (farmId: number, lat: number, lon: number): RegionInputRow => ({
	kind: 'farm',
	week: null,
	farmId,
	lat,
	lon,
	level: null,
	blocks: 0,
	alates: null,
	trapDays: null,
	traps: 0
});
const W = '2026-07-06';

describe('aggregateRegion', () => {
	// Three farms within 1 km of a resolution-5 cell's centre (47.1246 N, 96.8460 W, from h3-js
	// cellToLatLng; cell edge ~9.9 km) share it; one farm 50 km north sits alone in another.
	const rows: RegionInputRow[] = [
		farm(1, 47.125, -96.846),
		farm(2, 47.129, -96.85),
		farm(3, 47.121, -96.842),
		farm(4, 47.65, -96.9),
		...[1, 2, 3].map((id) => ({
			...farm(id, 47.125, -96.846),
			kind: 'level' as const,
			week: W,
			level: 'action' as const,
			blocks: 2
		})),
		{ ...farm(4, 47.65, -96.9), kind: 'level', week: W, level: 'severe', blocks: 1 },
		{ ...farm(1, 47.125, -96.846), kind: 'trap', week: W, alates: 14, trapDays: 7, traps: 1 },
		{ ...farm(2, 47.129, -96.85), kind: 'trap', week: W, alates: 28, trapDays: 7, traps: 1 }
	];
	const out = aggregateRegion(rows, [W], 5);

	it('keeps only cells with 3 farms and counts the withheld ones', () => {
		expect(out.features).toHaveLength(1);
		expect(out.withheldCells).toBe(1);
		expect(out.features[0].properties.cell).toBe(latLngToCell(47.125, -96.846, 5));
		expect(out.features[0].properties.farms).toBe(3);
	});

	it('sums levels but withholds a trap figure that only 2 farms stand behind', () => {
		const w = out.features[0].properties.weeks[0];
		expect(w.levels).toEqual({ calm: 0, stirring: 0, action: 6, severe: 0 });
		expect(w.median).toBe('action');
		expect(w.alatesPerTrapWeek).toBeNull();
	});

	it('gives winged aphids per trap per 7 days when 3 farms read traps', () => {
		const more = [
			...rows,
			{
				...farm(3, 47.121, -96.842),
				kind: 'trap' as const,
				week: W,
				alates: 6,
				trapDays: 14,
				traps: 1
			}
		];
		const w = aggregateRegion(more, [W], 5).features[0].properties.weeks[0];
		// (14 + 28 + 6) alates over 28 trap-days = 12 per trap-week (computed)
		expect(w.alatesPerTrapWeek).toBe(12);
		expect(w.traps).toBe(3);
	});

	it('carries no farm id or position in its output', () => {
		const text = JSON.stringify(out);
		expect(text).not.toMatch(/farmId|"lat"|"lon"/);
		expect(text).not.toContain('47.129');
	});
});

describe('medianLevel', () => {
	it('takes the upper median in calm..severe order', () => {
		expect(medianLevel({ calm: 2, stirring: 1, action: 1, severe: 0 })).toBe('stirring');
		expect(medianLevel({ calm: 3, stirring: 0, action: 0, severe: 1 })).toBe('calm');
		expect(medianLevel({ calm: 0, stirring: 0, action: 0, severe: 0 })).toBeNull();
	});
});

describe('weeksBetween', () => {
	it('gives whole ISO weeks from Monday, 10 by default', () => {
		const w = weeksBetween({}, new Date('2026-07-08T12:00:00Z'));
		if (!('weeks' in w) || !w.weeks) throw new Error('expected weeks');
		expect(w.weeks).toHaveLength(10);
		expect(w.weeks[9]).toEqual({ start: '2026-07-06', next: '2026-07-13' });
	});
	it('refuses more than 26 weeks', () => {
		expect(weeksBetween({ from: '2026-01-01', to: '2026-12-01' })).toMatchObject({
			message: expect.stringMatching(/at most 26 weeks/)
		});
	});
});

describe('graticule', () => {
	it('draws labelled lines at a step that suits the zoom', () => {
		expect(graticuleStep(12)).toBe(0.05);
		const lines = graticule({ south: 47.1, west: -97, north: 47.3, east: -96.8 }, 12);
		expect(lines.filter((l) => l.kind === 'lat').map((l) => l.label)).toEqual([
			'47.10° N',
			'47.15° N',
			'47.20° N',
			'47.25° N',
			'47.30° N'
		]);
		expect(lines.some((l) => l.label === '96.90° W')).toBe(true);
	});
});

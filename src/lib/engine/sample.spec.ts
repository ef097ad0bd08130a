import { describe, expect, it } from 'vitest';
import { mean, sampleStandardDeviation } from 'simple-statistics';
import jStat from 'jstat';
import { EngineInputError } from './errors';
import { summarizeSample } from './sample';
import type { VisitInput } from './types';

const visit = (counts: number[], extra: Partial<VisitInput> = {}): VisitInput => ({
	date: '2025-07-10',
	sampleUnit: 'leaf',
	units: counts.map((aphids) => ({ aphids })),
	...extra
});

describe('summarizeSample', () => {
	it('matches simple-statistics and a jstat t interval', () => {
		const counts = [0, 3, 12, 7, 0, 25, 4, 9, 1, 0];
		const s = summarizeSample(visit(counts), { unitsPerPlant: 5 });
		expect(s.mean).toBeCloseTo(mean(counts), 12);
		expect(s.sd).toBeCloseTo(sampleStandardDeviation(counts), 12);
		expect(s.se).toBeCloseTo(sampleStandardDeviation(counts) / Math.sqrt(10), 12);
		const half = jStat.studentt.inv(0.975, 9) * s.se!;
		expect(s.ci95![1]).toBeCloseTo(mean(counts) + half, 6);
		expect(s.ci95![0]).toBeCloseTo(Math.max(0, mean(counts) - half), 6);
		expect(s.infested).toBe(7);
		expect(s.perPlant!.mean).toBeCloseTo(mean(counts) * 5, 12);
	});

	it('handles an all-zero sample', () => {
		const s = summarizeSample(visit([0, 0, 0, 0]));
		expect(s).toMatchObject({
			mean: 0,
			sd: 0,
			se: 0,
			ci95: [0, 0],
			infested: 0,
			proportionInfested: 0
		});
	});

	it('gives a mean but no spread for a single unit', () => {
		const s = summarizeSample(visit([17]));
		expect(s).toMatchObject({
			n: 1,
			mean: 17,
			sd: null,
			se: null,
			ci95: null,
			proportionInfested: 1
		});
	});

	it('handles every unit infested', () => {
		const s = summarizeSample(visit([5, 8, 2]));
		expect(s.proportionInfested).toBe(1);
		expect(s.proportionCi95[1]).toBe(1);
	});

	it('counts infested at a tally threshold and reads presence-absence units', () => {
		const v: VisitInput = {
			date: '2025-07-10',
			sampleUnit: 'plant',
			units: [{ aphids: 40 }, { aphids: 39 }, { infested: true }, { infested: false }]
		};
		const s = summarizeSample(v, { tallyThreshold: 40 });
		expect(s.infested).toBe(2);
		expect(s.counted).toBe(2);
		expect(s.mean).toBe(39.5);
	});

	it('rejects bad counts with the field named', () => {
		const bad = (v: VisitInput, field: string) => {
			try {
				summarizeSample(v);
				expect.unreachable();
			} catch (e) {
				expect(e).toBeInstanceOf(EngineInputError);
				expect((e as EngineInputError).field).toBe(field);
			}
		};
		bad(visit([1, -2]), 'visit.units[1].aphids');
		bad(visit([1, 2.5]), 'visit.units[1].aphids');
		bad(visit([]), 'visit.units');
		bad({ ...visit([1]), units: [{ aphids: 2, alate: 3 }] }, 'visit.units[0].alate');
		bad({ ...visit([1]), mummies: -1 }, 'visit.mummies');
	});
});

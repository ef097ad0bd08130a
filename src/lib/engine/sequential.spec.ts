import { describe, expect, it } from 'vitest';
import { lnNegBinomialPmf } from './binomial';
import { sprtDecide, sprtNegBinomial, sprtPoisson, sprtProportion } from './sequential';
import { batchDecide, SPEED_SCOUTING_SOYBEAN } from './speedScout';

const e10 = { alpha: 0.1, beta: 0.1 };

describe('Wald SPRT for proportions', () => {
	// Computed check matching Giles et al. 2003, J. Econ. Entomol. 96:975 (authors from memory).
	const l = sprtProportion(0.02, 0.1, e10);

	it('has slope 0.05025 and h 1.2966', () => {
		expect(l.slope).toBeCloseTo(0.05025, 5);
		expect(l.hLower).toBeCloseTo(1.2966, 4);
		expect(l.hUpper).toBeCloseTo(1.2966, 4);
	});

	it('decides no action at n = 26 with no positives, not before', () => {
		expect(sprtDecide(l, 25, 0).decision).toBe('keep-sampling');
		expect(sprtDecide(l, 25, 0).unitsStillNeeded).toBe(1);
		expect(sprtDecide(l, 26, 0).decision).toBe('no-action');
		expect(sprtDecide(l, 0, 0).unitsToNoAction).toBe(26);
	});

	it('has lines 1.22 and 3.81 at n = 50', () => {
		const a = sprtDecide(l, 50, 2);
		expect(a.lower).toBeCloseTo(1.22, 2);
		expect(a.upper).toBeCloseTo(3.81, 2);
		expect(a.decision).toBe('keep-sampling');
		expect(sprtDecide(l, 50, 4).decision).toBe('act');
	});
});

describe('Wald SPRT for counts', () => {
	it('negative-binomial lines tend to the Poisson lines as k grows (computed)', () => {
		const p = sprtPoisson(5, 10, e10);
		const nb = sprtNegBinomial(5, 10, 1e7, e10);
		expect(nb.slope).toBeCloseTo(p.slope, 4);
		expect(nb.hLower).toBeCloseTo(p.hLower, 4);
	});

	it('negative-binomial lines are where the log likelihood ratio meets the Wald bounds (computed)', () => {
		const [m0, m1, k] = [5, 10, 2];
		const l = sprtNegBinomial(m0, m1, k, e10);
		const counts = [3, 0, 14, 7, 9, 22, 1, 5, 11, 8];
		let llr = 0;
		let d = 0;
		counts.forEach((x, i) => {
			llr += lnNegBinomialPmf(x, m1, k) - lnNegBinomialPmf(x, m0, k);
			d += x;
			const byLr =
				llr >= Math.log((1 - 0.1) / 0.1)
					? 'act'
					: llr <= Math.log(0.1 / 0.9)
						? 'no-action'
						: 'keep-sampling';
			expect(sprtDecide(l, i + 1, d).decision).toBe(byLr);
		});
	});
});

describe('soybean aphid speed scouting preset', () => {
	const plan = SPEED_SCOUTING_SOYBEAN;
	// Hodgson et al., University of Minnesota / Iowa State extension.
	it('uses the published tally, start, step and maximum', () => {
		expect(plan.tallyThreshold.value).toBe(40);
		expect([plan.start.value, plan.step.value, plan.max.value]).toEqual([11, 5, 31]);
	});

	it('reproduces the published 11-plant row: 0-6 no action, 7-10 take 5 more, 11 treat', () => {
		for (let d = 0; d <= 6; d++) expect(batchDecide(plan, 11, d).decision).toBe('no-action');
		for (let d = 7; d <= 10; d++) {
			expect(batchDecide(plan, 11, d)).toMatchObject({
				decision: 'keep-sampling',
				unitsStillNeeded: 5
			});
		}
		expect(batchDecide(plan, 11, 11).decision).toBe('act');
	});

	it('asks for the first 11, completes batches and resamples after 31', () => {
		expect(batchDecide(plan, 4, 2)).toMatchObject({
			decision: 'keep-sampling',
			unitsStillNeeded: 7
		});
		expect(batchDecide(plan, 13, 9).unitsStillNeeded).toBe(3);
		const lines = plan.lines.value;
		const undecided = Math.ceil(lines.slope * 31 - lines.hLower + 1e-9);
		expect(batchDecide(plan, 31, undecided).decision).toBe('resample');
	});
});

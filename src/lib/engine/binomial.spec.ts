import { describe, expect, it } from 'vitest';
import { linearRegression } from 'simple-statistics';
import {
	lnNegBinomialPmf,
	meanFromProportionEmpirical,
	meanFromProportionTaylor,
	proportionFromMeanEmpirical,
	proportionFromMeanTaylor
} from './binomial';
import { EngineInputError } from './errors';
import { fitTaylor, meanVariance } from './taylor';

describe('empirical presence-absence model', () => {
	it('satisfies ln(-ln(1-P)) = a + b ln m and inverts', () => {
		// Model form attributed to Kono and Sugino 1958 (from memory); coefficients are demo values.
		const c = { a: -0.9, b: 0.75 };
		const p = proportionFromMeanEmpirical(12.5, c);
		expect(Math.log(-Math.log(1 - p))).toBeCloseTo(c.a + c.b * Math.log(12.5), 12);
		expect(meanFromProportionEmpirical(p, c)).toBeCloseTo(12.5, 9);
	});
});

describe('negative binomial with Taylor coefficients', () => {
	it('P0 follows the Wilson and Room 1983 form (formula from memory)', () => {
		const t = { a: 3, b: 1.4 };
		const m = 6;
		const q = t.a * m ** (t.b - 1);
		const p0 = Math.exp((-m * Math.log(q)) / (q - 1));
		expect(1 - proportionFromMeanTaylor(m, t)).toBeCloseTo(p0, 12);
	});

	it('agrees with summed negative-binomial probabilities at a tally threshold (computed)', () => {
		const t = { a: 2.5, b: 1.3 };
		const m = 8;
		const k = m / (t.a * m ** (t.b - 1) - 1);
		let below = 0;
		for (let x = 0; x < 5; x++) below += Math.exp(lnNegBinomialPmf(x, m, k));
		expect(proportionFromMeanTaylor(m, t, 5)).toBeCloseTo(1 - below, 10);
	});

	it('falls back to Poisson where variance does not exceed the mean', () => {
		expect(proportionFromMeanTaylor(2, { a: 1, b: 1 })).toBeCloseTo(1 - Math.exp(-2), 12);
	});

	it('inverts for sampling plans', () => {
		const t = { a: 2.5, b: 1.3 };
		const p = proportionFromMeanTaylor(10, t, 3);
		expect(meanFromProportionTaylor(p, t, 3)).toBeCloseTo(10, 6);
		expect(() => meanFromProportionTaylor(1, t)).toThrow(EngineInputError);
	});
});

describe('fitting Taylor coefficients from own counts', () => {
	it('matches a simple-statistics regression of ln variance on ln mean', () => {
		const samples = [
			[0, 1, 3, 0, 2, 5, 1],
			[4, 9, 0, 12, 3, 7, 15],
			[20, 45, 3, 60, 11, 38, 25],
			[80, 150, 40, 210, 95, 30, 120]
		];
		const fit = fitTaylor(samples);
		const ref = linearRegression(
			samples.map((s) => {
				const { mean, variance } = meanVariance(s);
				return [Math.log(mean), Math.log(variance)];
			})
		);
		expect(fit.b).toBeCloseTo(ref.m, 12);
		expect(fit.a).toBeCloseTo(Math.exp(ref.b), 12);
		expect(fit.used).toBe(4);
	});

	it('needs at least three usable samples', () => {
		expect(() =>
			fitTaylor([
				[1, 2],
				[0, 0]
			])
		).toThrow(EngineInputError);
	});
});

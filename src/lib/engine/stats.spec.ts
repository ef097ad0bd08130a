import { describe, expect, it } from 'vitest';
import jStat from 'jstat';
import { linearRegression, rSquared } from 'simple-statistics';
import { incBeta, linearFit, tCdf, tQuantile, wilson95 } from './stats';

describe('t distribution', () => {
	it('matches printed t tables', () => {
		// Student t tables (any statistics text): t(0.975; 1) = 12.706, t(0.975; 10) = 2.228.
		expect(tQuantile(0.975, 1)).toBeCloseTo(12.706, 3);
		expect(tQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
		// R qt(0.975, 10) = 2.228139 (from memory).
		expect(tQuantile(0.975, 10)).toBeCloseTo(2.228139, 6);
		expect(tQuantile(0.975, 1e6)).toBeCloseTo(1.96, 2);
	});

	it('matches SciPy to 12 places (computed with scipy.stats.t while writing this test)', () => {
		expect(tCdf(1.3, 120)).toBeCloseTo(0.901953761120457, 12);
		expect(tCdf(1.3, 599)).toBeCloseTo(0.902949509973746, 12);
		expect(tQuantile(0.975, 50)).toBeCloseTo(2.0085591121, 9);
		expect(tQuantile(0.975, 599)).toBeCloseTo(1.9639322489, 9);
	});

	it('agrees with jstat quantiles and cdf over many degrees of freedom', () => {
		for (const df of [1, 2, 3, 4, 5, 7, 10, 19, 29, 50, 120, 599]) {
			for (const p of [0.6, 0.9, 0.95, 0.975, 0.995]) {
				expect(tQuantile(p, df)).toBeCloseTo(jStat.studentt.inv(p, df), 6);
				expect(tQuantile(1 - p, df)).toBeCloseTo(jStat.studentt.inv(1 - p, df), 6);
			}
			// jstat's own continued fraction stops near 1e-8, so agreement is checked to 7 places.
			expect(tCdf(1.3, df)).toBeCloseTo(jStat.studentt.cdf(1.3, df), 7);
		}
	});

	it('incomplete beta agrees with jstat', () => {
		for (const [x, a, b] of [
			[0.3, 2, 5],
			[0.9, 0.5, 0.5],
			[0.01, 10, 1.5]
		]) {
			expect(incBeta(x, a, b)).toBeCloseTo(jStat.ibeta(x, a, b), 8);
		}
	});
});

describe('least squares', () => {
	it('agrees with simple-statistics', () => {
		const pts = [
			[1, 2.1],
			[2, 3.9],
			[4, 8.2],
			[7, 13.5],
			[9, 19]
		];
		const fit = linearFit(
			pts.map((p) => p[0]),
			pts.map((p) => p[1])
		)!;
		const ref = linearRegression(pts);
		expect(fit.slope).toBeCloseTo(ref.m, 12);
		expect(fit.intercept).toBeCloseTo(ref.b, 12);
		expect(fit.r2!).toBeCloseTo(
			rSquared(pts, (x) => ref.m * x + ref.b),
			12
		);
	});

	it('gives no fit when x does not vary', () => {
		expect(linearFit([3, 3, 3], [1, 2, 3])).toBeNull();
	});
});

describe('Wilson interval', () => {
	it('stays inside [0, 1] at the extremes and matches a textbook value', () => {
		// Newcombe 1998 (Stat. Med. 17:857, from memory): 0 of 10 -> 0 to 0.2775.
		const [lo, hi] = wilson95(0, 10);
		expect(lo).toBe(0);
		expect(hi).toBeCloseTo(0.2775, 4);
		expect(wilson95(10, 10)[1]).toBe(1);
	});
});

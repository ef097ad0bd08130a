import { describe, expect, it } from 'vitest';
import { linearRegression } from 'simple-statistics';
import { fitExponential, timeToReach } from './trend';

describe('exponential trend', () => {
	it('recovers r and doubling time from exact exponential counts', () => {
		const r = Math.LN2 / 6.8;
		const pts = [0, 4, 7, 11].map((x) => ({ x, value: 40 * Math.exp(r * x), n: 20 }));
		const t = fitExponential(pts)!;
		expect(t.r).toBeCloseTo(r, 10);
		expect(t.doubling).toBeCloseTo(6.8, 8);
		expect(t.rCi95![0]).toBeCloseTo(r, 8);
	});

	it('agrees with simple-statistics on noisy counts, and its interval holds r', () => {
		const pts = [
			{ x: 0, value: 12, n: 20 },
			{ x: 3, value: 30, n: 20 },
			{ x: 7, value: 41, n: 20 },
			{ x: 10, value: 110, n: 20 }
		];
		const t = fitExponential(pts)!;
		const ref = linearRegression(pts.map((p) => [p.x, Math.log(p.value)]));
		expect(t.r).toBeCloseTo(ref.m, 12);
		expect(t.rCi95![0]).toBeLessThan(t.r);
		expect(t.doublingCi95![0]!).toBeLessThan(t.doubling!);
	});

	it('drops leading zeros and replaces a later zero with half an aphid', () => {
		const t = fitExponential([
			{ x: 0, value: 0, n: 10 },
			{ x: 5, value: 2, n: 10 },
			{ x: 9, value: 0, n: 10 }
		])!;
		expect(t.droppedLeadingZeros).toBe(1);
		expect(t.replacedZeros).toBe(1);
		expect(t.anchor).toBeCloseTo(0.05, 12);
		expect(t.rising).toBe(false);
		expect(
			fitExponential([
				{ x: 0, value: 0, n: 5 },
				{ x: 3, value: 0, n: 5 }
			])
		).toBeNull();
	});

	it('forecast from the soybean threshold agrees in magnitude with the cage time to the injury level', () => {
		// Ragsdale et al. 2007: doubling 6.8 days; ET 250, EIL 674 per plant.
		const r = Math.LN2 / 6.8;
		const t = fitExponential(
			[0, 5, 10].map((x) => ({ x, value: 250 * Math.exp(r * (x - 10)), n: 30 }))
		)!;
		const days = timeToReach(t, 674)!.estimate;
		expect(days).toBeCloseTo(9.73, 2);
		// McCarville et al. 2011, J. Econ. Entomol. 104:845: 6.97 +/- 1.11 days in enemy-free
		// cages; field doubling is slower than cages, so only the magnitude should agree.
		expect(days / 6.97).toBeGreaterThan(0.5);
		expect(days / 6.97).toBeLessThan(2);
	});

	it('has no crossing for a falling population', () => {
		const t = fitExponential([
			{ x: 0, value: 50, n: 9 },
			{ x: 4, value: 20, n: 9 }
		])!;
		expect(timeToReach(t, 100)).toBeNull();
		expect(t.halving).toBeGreaterThan(0);
	});
});

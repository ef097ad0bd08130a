import { describe, expect, it } from 'vitest';
import { cumulativeAphidDays, yieldLoss } from './cad';
import { PESTS } from './library/pests';

const soy = PESTS.find((p) => p.code === 'soybean-aphid')!;
const greenbug = PESTS.find((p) => p.code === 'greenbug')!;

describe('cumulative aphid-days', () => {
	it('is the trapezoid area: 250 per plant for 20 days = 5,000 CAD', () => {
		expect(
			cumulativeAphidDays([
				{ day: 0, density: 250 },
				{ day: 20, density: 250 }
			])
		).toBe(5000);
		expect(
			cumulativeAphidDays([
				{ day: 0, density: 0 },
				{ day: 10, density: 100 },
				{ day: 14, density: 200 }
			])
		).toBe(1100);
	});
});

describe('published yield-loss relations', () => {
	it('soybean: 5,000 CAD is about 3.4 % (6.88 % per 10,000 CAD, via Ragsdale et al. 2007, from memory)', () => {
		const l = yieldLoss(soy, 5000, 0, 3000, 0.4)!;
		expect(l.percent).toBeCloseTo(3.44, 2);
		expect(l.kgPerHa).toBeCloseTo(103.2, 1);
		expect(l.money).toBeCloseTo(41.28, 2);
		// The same source: 500 per plant for 20 days is about 7 %.
		expect(yieldLoss(soy, 10_000, 0)!.percent).toBeCloseTo(6.88, 6);
	});

	it('greenbug: 14.5 kg/ha per aphid per stem (Kindler et al. 2003)', () => {
		const l = yieldLoss(greenbug, 0, 10, 5000)!;
		expect(l.kgPerHa).toBeCloseTo(145, 9);
		expect(l.percent).toBeCloseTo(2.9, 9);
	});
});

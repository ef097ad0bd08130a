import { describe, expect, it } from 'vitest';
import { assessBlock } from './assess';
import { plantVisit, soybeanBlock } from './fixtures';

// Thresholds: Ragsdale et al. 2007 (250 per plant, 80 % infested and rising; EIL 674).
const grow = (start: number, days: number[], doubling: number) =>
	days.map((d) => Math.round(start * 2 ** (d / doubling)));

describe('assessBlock on soybean aphid', () => {
	it('is calm when low and slow', () => {
		const a = assessBlock(
			soybeanBlock([plantVisit('2025-07-01', 20), plantVisit('2025-07-08', 24)])
		);
		expect(a.level).toBe('calm');
		expect(a.reason).toMatch(/^24 per plant/);
	});

	it('is stirring when forecast to reach 250 before the next visit, with the date in the reason', () => {
		const [a1, a2, a3] = grow(100, [0, 4, 8], 6.5);
		const v = [
			plantVisit('2025-07-01', a1),
			plantVisit('2025-07-05', a2),
			plantVisit('2025-07-09', a3)
		];
		const a = assessBlock(soybeanBlock(v));
		expect(a.level).toBe('stirring');
		expect(a.trend!.doubling).toBeCloseTo(6.5, 0);
		expect(a.forecast!.actionDate).toBe('2025-07-10');
		expect(a.reason).toBe(
			'235 per plant (100 % infested), doubling every 6.5 days; reaches 250 by 10 Jul'
		);
	});

	it('is action due at 250 per plant, 80 % infested and rising', () => {
		const v = [plantVisit('2025-07-01', 150), plantVisit('2025-07-05', 300)];
		const a = assessBlock(
			soybeanBlock(v, { block: { areaHa: 10, plantsPerHa: 350_000, rescoutDays: 3 } })
		);
		expect(a.level).toBe('action');
		expect(a.label).toBe('Action due');
	});

	it('is stirring at 300 per plant when fewer than 80 % of plants are infested', () => {
		const a = assessBlock(soybeanBlock([plantVisit('2025-07-05', 500, 20, 8)]));
		expect(a.latest!.proportionInfested).toBe(0.6);
		expect(a.value).toBe(300);
		expect(a.level).toBe('stirring');
	});

	it('is stirring when at threshold but falling (the rule requires rising)', () => {
		const a = assessBlock(
			soybeanBlock([plantVisit('2025-07-01', 400), plantVisit('2025-07-05', 300)])
		);
		expect(a.level).toBe('stirring');
		expect(a.reason).toMatch(/not rising/);
	});

	it('asks to confirm rising after a single visit', () => {
		const a = assessBlock(soybeanBlock([plantVisit('2025-07-05', 300)]));
		expect(a.level).toBe('action');
		expect(a.reason).toMatch(/confirm it is rising/);
	});

	it('is severe at the injury level, or when forecast to reach it before the next visit', () => {
		expect(assessBlock(soybeanBlock([plantVisit('2025-07-05', 700)])).level).toBe('severe');
		const v = [plantVisit('2025-07-01', 200), plantVisit('2025-07-04', 400)];
		const a = assessBlock(soybeanBlock(v));
		expect(a.level).toBe('severe');
		expect(a.forecast!.injuryDate).toBe('2025-07-07');
	});

	it('lowers action to stirring when more than 5 % are mummified (UK government guide)', () => {
		const v = [plantVisit('2025-07-01', 150), { ...plantVisit('2025-07-05', 300), mummies: 600 }];
		const a = assessBlock(
			soybeanBlock(v, { block: { areaHa: 10, plantsPerHa: 350_000, rescoutDays: 3 } })
		);
		expect(a.enemies.mummyShare).toBeCloseTo(600 / 6600, 9);
		expect(a.level).toBe('stirring');
		expect(a.reason).toMatch(/held back/);
	});

	it('reports CAD, the empirical loss and the sap drain side by side', () => {
		const a = assessBlock(
			soybeanBlock([plantVisit('2025-07-01', 250), plantVisit('2025-07-21', 250)])
		);
		expect(a.cad).toBe(5000);
		expect(a.yieldLoss!.percent).toBeCloseTo(3.44, 2);
		// Library sap sugar is 182 g/L (Jensen et al. 2013), not the worked example's 200.
		expect(a.sapDrain!.daily.sapLPerHaDay).toBeCloseTo(5.208, 3);
		expect(a.sapDrain!.season.sapLPerHa).toBeCloseTo(5.208 * 20, 2);
		expect(a.sapDrain!.assumptions.map((x) => x.name)).toContain('body mass (apterous)');
	});

	it('is plain JSON', () => {
		const v = [
			plantVisit('2025-07-01', 50),
			plantVisit('2025-07-05', 90),
			plantVisit('2025-07-09', 160)
		];
		const a = assessBlock(soybeanBlock(v));
		expect(JSON.parse(JSON.stringify(a))).toEqual(a);
	});

	it('adds a degree-day trend when weather is given', () => {
		const weather = Array.from({ length: 10 }, (_, i) => ({
			date: `2025-07-${String(i + 1).padStart(2, '0')}`,
			tminC: 15,
			tmaxC: 29
		}));
		const v = [
			plantVisit('2025-07-01', 50),
			plantVisit('2025-07-05', 90),
			plantVisit('2025-07-09', 160)
		];
		const a = assessBlock(soybeanBlock(v, { weather }));
		expect(a.trendDegreeDays!.basis).toBe('degree-days');
		// Single sine, 15/29 degC above the 8.6 degC base (Iowa State extension): all day above.
		expect(a.forecast!.degreeDays!.ddPerDayRecent).toBeCloseTo(22 - 8.6, 9);
		expect(a.trendDegreeDays!.r * (22 - 8.6)).toBeCloseTo(a.trend!.r, 9);
	});
});

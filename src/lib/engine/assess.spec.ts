import { describe, expect, it } from 'vitest';
import { assessBlock } from './assess';
import { EngineInputError } from './errors';
import { plantVisit, soybeanBlock } from './fixtures';
import { CROPS } from './library/crops';
import { PESTS } from './library/pests';
import { THRESHOLDS } from './library/thresholds';

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
			date: `2025-07-0${i}`.replace('-0', '-').replace('07-', '07-0').slice(0, 10),
			tminC: 15,
			tmaxC: 29
		})).map((w, i) => ({ ...w, date: `2025-07-${String(i + 1).padStart(2, '0')}` }));
		const v = [
			plantVisit('2025-07-01', 50),
			plantVisit('2025-07-05', 90),
			plantVisit('2025-07-09', 160)
		];
		const a = assessBlock(soybeanBlock(v, { weather }));
		expect(a.trendDegreeDays!.basis).toBe('degree-days');
		expect(a.forecast!.degreeDays!.ddPerDayRecent).toBeGreaterThan(0);
	});
});

describe('assessBlock on other crops', () => {
	it('uses a proportion rule for canola (20 % of plants, Western Australia via Queensland extension)', () => {
		const v = {
			date: '2025-08-01',
			sampleUnit: 'plant',
			units: Array.from({ length: 10 }, (_, i) => ({ infested: i < 3 }))
		};
		const a = assessBlock({
			asOf: '2025-08-01',
			crop: CROPS.find((c) => c.code === 'canola')!,
			pest: PESTS.find((p) => p.code === 'cabbage-aphid')!,
			thresholds: THRESHOLDS,
			block: { areaHa: 5, plantsPerHa: 500_000 },
			visits: [v]
		});
		expect(a.value).toBe(0.3);
		expect(a.level).toBe('action');
		expect(a.sapDrain).toBeNull();
	});

	it('says so when no rule fits', () => {
		const a = assessBlock(soybeanBlock([plantVisit('2025-06-01', 30, 10, 0, 20)]));
		expect(a.rule).toBeNull();
		expect(a.reason).toMatch(/No action threshold/);
	});
});

describe('assessBlock input errors', () => {
	const field = (fn: () => unknown) => {
		try {
			fn();
		} catch (e) {
			expect(e).toBeInstanceOf(EngineInputError);
			return (e as EngineInputError).field;
		}
		return null;
	};
	it('names the field', () => {
		const ok = [plantVisit('2025-07-01', 5), plantVisit('2025-07-05', 9)];
		expect(field(() => assessBlock(soybeanBlock([ok[1], ok[0]], { asOf: '2025-07-05' })))).toBe(
			'visits[1].date'
		);
		expect(
			field(() =>
				assessBlock(soybeanBlock([{ ...ok[0], date: '2025-02-30' }], { asOf: '2025-07-05' }))
			)
		).toBe('visits[0].date');
		expect(field(() => assessBlock(soybeanBlock(ok, { asOf: '2025-07-03' })))).toBe(
			'visits[1].date'
		);
		expect(
			field(() => assessBlock(soybeanBlock(ok, { block: { areaHa: 0, plantsPerHa: 1 } })))
		).toBe('block.areaHa');
		expect(field(() => assessBlock(soybeanBlock([{ ...ok[0], units: [] }])))).toBe(
			'visits[0].units'
		);
	});
});

describe('assessBlock rule choice', () => {
	const pecan = (date: string, perLeaf: number) =>
		assessBlock({
			asOf: date,
			crop: CROPS.find((c) => c.code === 'pecan')!,
			pest: PESTS.find((p) => p.code === 'yellow-pecan-aphids')!,
			thresholds: THRESHOLDS,
			block: { areaHa: 12, plantsPerHa: 70 },
			visits: [
				{
					date,
					sampleUnit: 'compound-leaf',
					units: Array.from({ length: 10 }, () => ({ aphids: perLeaf }))
				}
			]
		});

	it('follows the pecan calendar windows (UC IPM 2010: 20 per compound leaf to 15 Aug, 10 after)', () => {
		expect(pecan('2025-07-20', 15).level).toBe('calm');
		expect(pecan('2025-08-20', 15).level).toBe('action');
		expect(
			pecan('2025-08-20', 15).assumptions.find((a) => a.name === 'growth stage')
		).toBeDefined();
	});

	it('gives no sap drain for leaf counts without units per plant, and says the CAD unit', () => {
		const a = assessBlock({
			asOf: '2025-07-20',
			crop: CROPS.find((c) => c.code === 'cotton')!,
			pest: PESTS.find((p) => p.code === 'cotton-aphid')!,
			thresholds: THRESHOLDS,
			block: { areaHa: 30, plantsPerHa: 100_000 },
			visits: [
				{
					date: '2025-07-20',
					bbch: 65,
					sampleUnit: 'leaf',
					units: Array.from({ length: 40 }, (_, i) => ({ aphids: i * 3 }))
				}
			]
		});
		// UC IPM; Texas extension: about 50 per leaf mid-season.
		expect(a.value).toBe(58.5);
		expect(a.level).toBe('action');
		expect(a.sapDrain).toBeNull();
		expect(a.cadUnit).toBe('aphid-days per leaf');
	});
});

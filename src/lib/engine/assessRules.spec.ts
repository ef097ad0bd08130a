import { describe, expect, it } from 'vitest';
import { assessBlock } from './assess';
import { EngineInputError } from './errors';
import { plantVisit, soybeanBlock } from './fixtures';
import { CROPS } from './library/crops';
import { PESTS } from './library/pests';
import { THRESHOLDS } from './library/thresholds';

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

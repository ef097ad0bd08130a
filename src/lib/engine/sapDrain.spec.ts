import { describe, expect, it } from 'vitest';
import {
	GLUCOSE_G_PER_MOL,
	sapDrainDaily,
	scaleDrain,
	SUCROSE_G_PER_MOL,
	SUCROSE_TO_GLUCOSE
} from './sapDrain';
import type { CropParams, FeedingParams } from './types';

const s = (value: number) => ({ value, source: 'test', provenance: 'assumption' as const });

describe('molar masses from IUPAC atomic weights (computed)', () => {
	it('gives sucrose 342.30, glucose 180.16 and the 1.0526 factor', () => {
		expect(SUCROSE_G_PER_MOL).toBeCloseTo(342.3, 2);
		expect(GLUCOSE_G_PER_MOL).toBeCloseTo(180.16, 2);
		expect(SUCROSE_TO_GLUCOSE.value).toBeCloseTo(1.0526, 4);
		expect(SUCROSE_TO_GLUCOSE.provenance).toBe('computed');
	});
});

describe('sap drain, the sugar-to-yield worked example (computed)', () => {
	// 0.2 mg per aphid is an assumption; 12.4 nl/mg/h from Rhodes, Croghan and Dixon 1996.
	const feeding: FeedingParams = {
		morph: 'apterous',
		bodyMassMg: s(0.2),
		ingestionNlPerMgH: s(12.4),
		sapSugarGPerL: s(200),
		excretedSugarFraction: s(0.31)
	};
	const soybean: CropParams = {
		code: 'soybean',
		name: 'Soybean',
		harvestedOrgan: 'seed',
		glucoseReqGPerG: s(2.0),
		defaultPlantsPerHa: s(350_000)
	};
	const d = sapDrainDaily(250, 350_000, feeding, soybean);

	it('250 per plant x 350,000 plants: 59.5 nl per aphid, 5.2 L sap, 1.04 kg sucrose, 0.55 kg seed per ha per day', () => {
		expect(d.aphidsPerHa).toBe(8.75e7);
		expect(d.nlPerAphidDay).toBeCloseTo(59.52, 2);
		expect(d.sapLPerHaDay).toBeCloseTo(5.2, 1);
		expect(d.sugarKgPerHaDay).toBeCloseTo(1.04, 2);
		expect(d.yieldEqKgPerHaDay).toBeCloseTo(0.55, 2);
		// Rhodes et al. 1996: 31 % of ingested sucrose excreted as honeydew.
		expect(d.honeydewSugarKgPerHaDay).toBeCloseTo(0.31 * d.sugarKgPerHaDay, 12);
	});

	it('over 20 days comes to about 11 kg seed per ha', () => {
		expect(scaleDrain(d, 20).yieldEqKgPerHaDay).toBeCloseTo(11, 0);
	});
});

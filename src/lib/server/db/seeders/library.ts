import type { Transaction } from 'sequelize';
import { CROPS, PESTS, SAMPLE_UNITS, THRESHOLDS } from '../../../engine/library';
import { Crop, Pest, SampleUnit, ThresholdRule } from '../models';

/**
 * Loads the engine's parameter library (crops, pests, sample units, library threshold rules)
 * into the database. Existing rows are left as agronomists may have edited them.
 */
export async function seedLibrary(transaction: Transaction) {
	const crops = new Map<string, number>();
	const pests = new Map<string, number>();
	const units = new Map<string, number>();
	for (const c of CROPS) {
		const [row] = await Crop.findOrCreate({
			where: { code: c.code },
			defaults: { code: c.code, name: c.name, params: c },
			transaction
		});
		crops.set(c.code, row.id);
	}
	for (const p of PESTS) {
		const [row] = await Pest.findOrCreate({
			where: { code: p.code },
			defaults: { code: p.code, name: p.name, scientificName: p.scientificName, params: p },
			transaction
		});
		pests.set(p.code, row.id);
	}
	for (const u of SAMPLE_UNITS) {
		const [row] = await SampleUnit.findOrCreate({
			where: { code: u.code },
			defaults: {
				code: u.code,
				name: u.name,
				unitsPerPlantDefault: u.unitsPerPlantDefault ?? null
			},
			transaction
		});
		units.set(u.code, row.id);
	}
	if ((await ThresholdRule.count({ where: { organisationId: null }, transaction })) === 0) {
		await ThresholdRule.bulkCreate(
			THRESHOLDS.map((t) => ({
				organisationId: null,
				cropId: crops.get(t.cropCode)!,
				pestId: pests.get(t.pestCode)!,
				sampleUnitId: units.get(t.sampleUnit)!,
				bbchFrom: t.bbchFrom,
				bbchTo: t.bbchTo,
				metric: t.metric,
				tallyThreshold: t.tallyThreshold ?? null,
				action: t.action,
				injury: t.injury ?? null,
				requiresRising: t.requiresRising ?? false,
				alsoProportion: t.alsoProportion ?? null,
				label: t.label,
				source: t.source,
				provenance: t.provenance
			})),
			{ transaction }
		);
	}
	return { crops, pests, units };
}

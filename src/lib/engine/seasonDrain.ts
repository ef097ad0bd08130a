import type { DensityPoint } from './cad';
import { drainAssumptions, sapDrainDaily, scaleDrain, type SapDrainDaily } from './sapDrain';
import type { AssessBlockInput, Assumption } from './types';
import { kgToLb, lPerHaToGalPerAcre, perHaToPerAcre } from './units';

export interface SapDrainReport {
	/** Direct drain at the latest density, per hectare per day (an estimate). */
	daily: SapDrainDaily;
	/** Accumulated first to last visit (trapezoid over days), per hectare. */
	season: {
		sapLPerHa: number;
		sugarKgPerHa: number;
		honeydewSugarKgPerHa: number;
		yieldEqKgPerHa: number;
	};
	/** The season totals for the whole block. */
	block: { areaHa: number; sapL: number; sugarKg: number; yieldEqKg: number };
	imperial: { sapGalPerAcreDay: number; sugarLbPerAcreDay: number; seasonYieldEqLbPerAcre: number };
	note: string;
	assumptions: Assumption[];
}

/** Sap drain today and over the season, from aphids-per-plant points and their CAD. */
export function seasonDrain(
	points: readonly DensityPoint[],
	input: AssessBlockInput,
	cad: number
): SapDrainReport {
	const { block, crop, pest } = input;
	const latest = points.length ? points[points.length - 1].density : 0;
	const daily = sapDrainDaily(latest, block.plantsPerHa, pest.feeding, crop);
	// Drain is linear in density, so the season is the one-aphid-per-plant drain times CAD.
	const season: SapDrainDaily = scaleDrain(
		sapDrainDaily(1, block.plantsPerHa, pest.feeding, crop),
		cad
	);
	const plants =
		block.plantsPerHa === crop.defaultPlantsPerHa.value
			? crop.defaultPlantsPerHa
			: { value: block.plantsPerHa, source: 'block record', provenance: 'assumption' as const };
	return {
		daily,
		season: {
			sapLPerHa: season.sapLPerHaDay,
			sugarKgPerHa: season.sugarKgPerHaDay,
			honeydewSugarKgPerHa: season.honeydewSugarKgPerHaDay,
			yieldEqKgPerHa: season.yieldEqKgPerHaDay
		},
		block: {
			areaHa: block.areaHa,
			sapL: season.sapLPerHaDay * block.areaHa,
			sugarKg: season.sugarKgPerHaDay * block.areaHa,
			yieldEqKg: season.yieldEqKgPerHaDay * block.areaHa
		},
		imperial: {
			sapGalPerAcreDay: lPerHaToGalPerAcre(daily.sapLPerHaDay),
			sugarLbPerAcreDay: kgToLb(perHaToPerAcre(daily.sugarKgPerHaDay)),
			seasonYieldEqLbPerAcre: kgToLb(perHaToPerAcre(season.yieldEqKgPerHaDay))
		},
		note: 'Sugar removed by feeding only; the empirical yield-loss figure also counts saliva, virus and defence costs',
		assumptions: drainAssumptions(pest.feeding, crop, plants)
	};
}

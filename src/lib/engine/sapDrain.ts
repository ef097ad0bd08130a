import { nonNegative, positive } from './errors';
import type { Assumption, CropParams, FeedingParams, Sourced } from './types';

const IUPAC = 'IUPAC standard atomic weights (conventional values)';
/** Atomic weights, g/mol. */
export const ATOMIC_WEIGHT = { C: 12.011, H: 1.008, O: 15.999 } as const;

/** Molar mass of CcHhOo in g/mol from the atomic weights. */
export function molarMass(c: number, h: number, o: number): number {
	return c * ATOMIC_WEIGHT.C + h * ATOMIC_WEIGHT.H + o * ATOMIC_WEIGHT.O;
}

export const SUCROSE_G_PER_MOL = molarMass(12, 22, 11);
export const GLUCOSE_G_PER_MOL = molarMass(6, 12, 6);
/** Sucrose + water -> 2 glucose: grams of glucose per gram of sucrose (computed, ~1.0526). */
export const SUCROSE_TO_GLUCOSE: Sourced<number> = {
	value: (2 * GLUCOSE_G_PER_MOL) / SUCROSE_G_PER_MOL,
	source: `2 x glucose / sucrose molar mass from ${IUPAC}`,
	provenance: 'computed'
};

export interface SapDrainDaily {
	aphidsPerHa: number;
	nlPerAphidDay: number;
	sapLPerHaDay: number;
	sugarKgPerHaDay: number;
	honeydewSugarKgPerHaDay: number;
	glucoseEqKgPerHaDay: number;
	/** Direct drain only: what the sugar removed would have built of the harvested organ. */
	yieldEqKgPerHaDay: number;
}

/** Daily sap and sugar drain per hectare at a density of aphids per plant. */
export function sapDrainDaily(
	perPlant: number,
	plantsPerHa: number,
	feeding: FeedingParams,
	crop: CropParams
): SapDrainDaily {
	nonNegative(perPlant, 'perPlant');
	positive(plantsPerHa, 'block.plantsPerHa');
	const nl =
		positive(feeding.bodyMassMg.value, 'feeding.bodyMassMg') *
		positive(feeding.ingestionNlPerMgH.value, 'feeding.ingestionNlPerMgH') *
		24;
	const gPerL = nonNegative(feeding.sapSugarGPerL.value, 'feeding.sapSugarGPerL');
	const excreted = nonNegative(
		feeding.excretedSugarFraction.value,
		'feeding.excretedSugarFraction'
	);
	const req = positive(crop.glucoseReqGPerG.value, 'crop.glucoseReqGPerG');
	const aphidsPerHa = perPlant * plantsPerHa;
	const sapL = aphidsPerHa * nl * 1e-9;
	const sugarKg = (sapL * gPerL) / 1000;
	const glucoseKg = sugarKg * SUCROSE_TO_GLUCOSE.value;
	return {
		aphidsPerHa,
		nlPerAphidDay: nl,
		sapLPerHaDay: sapL,
		sugarKgPerHaDay: sugarKg,
		honeydewSugarKgPerHaDay: sugarKg * Math.min(1, excreted),
		glucoseEqKgPerHaDay: glucoseKg,
		yieldEqKgPerHaDay: glucoseKg / req
	};
}

/** Scale every daily figure by a factor (trapezoid sums use aphid-days in place of aphids). */
export function scaleDrain(d: SapDrainDaily, factor: number): SapDrainDaily {
	return {
		aphidsPerHa: d.aphidsPerHa * factor,
		nlPerAphidDay: d.nlPerAphidDay,
		sapLPerHaDay: d.sapLPerHaDay * factor,
		sugarKgPerHaDay: d.sugarKgPerHaDay * factor,
		honeydewSugarKgPerHaDay: d.honeydewSugarKgPerHaDay * factor,
		glucoseEqKgPerHaDay: d.glucoseEqKgPerHaDay * factor,
		yieldEqKgPerHaDay: d.yieldEqKgPerHaDay * factor
	};
}

/** Every value the drain figure rests on, for display beside it. */
export function drainAssumptions(
	feeding: FeedingParams,
	crop: CropParams,
	plantsPerHa: Sourced<number>
): Assumption[] {
	const a = (name: string, s: Sourced<number>, unit: string): Assumption => ({
		name,
		value: s.value,
		unit,
		source: s.source,
		provenance: s.provenance
	});
	return [
		a(`body mass (${feeding.morph})`, feeding.bodyMassMg, 'mg'),
		a('sap ingestion rate', feeding.ingestionNlPerMgH, 'nl per mg aphid per hour'),
		a('phloem sap sugar', feeding.sapSugarGPerL, 'g sucrose per L'),
		a('sugar excreted as honeydew', feeding.excretedSugarFraction, 'fraction'),
		a('sucrose to glucose', SUCROSE_TO_GLUCOSE, 'g glucose per g sucrose'),
		a(`glucose requirement (${crop.harvestedOrgan})`, crop.glucoseReqGPerG, 'g glucose per g'),
		a('plants per area', plantsPerHa, 'plants per ha')
	];
}

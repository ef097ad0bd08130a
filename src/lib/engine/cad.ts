import { EngineInputError, nonNegative, positive } from './errors';
import type { Assumption, PestParams } from './types';

export interface DensityPoint {
	day: number;
	/** Aphids per plant (CAD) or per yield-loss unit (stem). */
	density: number;
}

/** Cumulative aphid-days: trapezoid area under density over days, first to last point. */
export function cumulativeAphidDays(points: readonly DensityPoint[]): number {
	let cad = 0;
	for (let i = 1; i < points.length; i++) {
		const dt = points[i].day - points[i - 1].day;
		if (dt < 0) throw new EngineInputError(`points[${i}].day`, 'days must be in order');
		cad += (dt * (points[i].density + points[i - 1].density)) / 2;
	}
	return cad;
}

export interface YieldLoss {
	kind: 'percent-per-cad' | 'kg-per-aphid-per-unit';
	/** Empirical relation: includes saliva, virus and defence costs, not only sap removed. */
	percent: number | null;
	kgPerHa: number | null;
	money: number | null;
	basis: string;
	assumptions: Assumption[];
}

/**
 * Yield loss from the pest's published relation: % per CAD (soybean) or kg/ha per aphid per
 * unit (greenbug, applied to the season's peak density per unit).
 */
export function yieldLoss(
	pest: PestParams,
	cad: number,
	peakPerUnit: number,
	expectedYieldKgHa?: number,
	pricePerKg?: number
): YieldLoss | null {
	const rel = pest.yieldLoss;
	if (!rel) return null;
	nonNegative(cad, 'cad');
	const v = rel.value;
	nonNegative(v.value, 'pest.yieldLoss.value');
	const a: Assumption[] = [
		{
			name: 'yield-loss relation',
			value: v.value,
			unit: rel.kind,
			source: v.source,
			provenance: v.provenance
		}
	];
	const yieldKg =
		expectedYieldKgHa === undefined ? null : positive(expectedYieldKgHa, 'block.expectedYieldKgHa');
	const price = pricePerKg === undefined ? null : nonNegative(pricePerKg, 'block.pricePerKg');
	let percent: number | null;
	let kg: number | null;
	let basis: string;
	if (rel.kind === 'percent-per-cad') {
		percent = Math.min(100, cad * v.value);
		kg = yieldKg === null ? null : (percent / 100) * yieldKg;
		basis = `${Math.round(cad)} cumulative aphid-days`;
	} else {
		kg = nonNegative(peakPerUnit, 'peakPerUnit') * v.value;
		if (yieldKg !== null) kg = Math.min(kg, yieldKg);
		percent = yieldKg === null ? null : (100 * kg) / yieldKg;
		basis = 'peak density per unit this season';
		a.push({
			name: 'density used',
			value: peakPerUnit,
			unit: 'aphids per unit',
			source: 'season peak',
			provenance: 'assumption'
		});
	}
	return {
		kind: rel.kind,
		percent,
		kgPerHa: kg,
		money: kg !== null && price !== null ? kg * price : null,
		basis,
		assumptions: a
	};
}

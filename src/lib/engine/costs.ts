import { cumulativeAphidDays, yieldLoss, type DensityPoint, type YieldLoss } from './cad';
import type { SampleSummary } from './sample';
import { seasonDrain, type SapDrainReport } from './seasonDrain';
import type { AssessBlockInput } from './types';
import type { PreparedVisits } from './visits';

export interface SeasonCosts {
	cad: number;
	cadUnit: string;
	yieldLoss: YieldLoss | null;
	sapDrain: SapDrainReport | null;
}

/** CAD, the empirical yield loss and the direct sap drain over the visits with counts. */
export function seasonCosts(
	same: PreparedVisits,
	input: AssessBlockInput,
	latest: SampleSummary | null
): SeasonCosts {
	const { pest, block } = input;
	const upp = latest?.unitsPerPlant ?? null;
	const points: DensityPoint[] = [];
	let peak = 0;
	same.summaries.forEach((s, i) => {
		if (s.mean === null) return;
		points.push({ day: same.days[i], density: s.mean * (s.unitsPerPlant ?? 1) });
		peak = Math.max(peak, s.mean);
	});
	const cad = cumulativeAphidDays(points);
	// The soybean relation is per plant; without units per plant it cannot be applied.
	const loss =
		pest.yieldLoss?.kind === 'percent-per-cad' && upp === null
			? null
			: yieldLoss(pest, cad, peak, block.expectedYieldKgHa, block.pricePerKg);
	return {
		cad,
		cadUnit:
			upp === null ? `aphid-days per ${latest?.sampleUnit ?? 'unit'}` : 'aphid-days per plant',
		yieldLoss: loss,
		sapDrain: upp === null || latest?.mean == null ? null : seasonDrain(points, input, cad)
	};
}

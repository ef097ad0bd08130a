// Demo data for tests and the bench: counts here are invented, parameters come from the library.
import { CROPS } from './library/crops';
import { PESTS } from './library/pests';
import { THRESHOLDS } from './library/thresholds';
import type { AssessBlockInput, VisitInput } from './types';

/** A visit of `n` plants, each carrying `perPlant` aphids, with `clean` plants left at 0. */
export function plantVisit(
	date: string,
	perPlant: number,
	n = 20,
	clean = 0,
	bbch = 65
): VisitInput {
	const units = Array.from({ length: n }, (_, i) => ({ aphids: i < clean ? 0 : perPlant }));
	return { date, bbch, sampleUnit: 'plant', units };
}

/** A soybean block with library defaults; override any part. */
export function soybeanBlock(
	visits: VisitInput[],
	over: Partial<AssessBlockInput> = {}
): AssessBlockInput {
	return {
		asOf: visits.length ? visits[visits.length - 1].date : '2025-07-01',
		crop: CROPS.find((c) => c.code === 'soybean')!,
		pest: PESTS.find((p) => p.code === 'soybean-aphid')!,
		thresholds: THRESHOLDS,
		block: {
			areaHa: 40,
			plantsPerHa: 350_000,
			expectedYieldKgHa: 3000,
			pricePerKg: 0.4,
			rescoutDays: 7
		},
		visits,
		...over
	};
}

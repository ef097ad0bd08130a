import { addDays, formatISO } from 'date-fns';
import type { Rng } from './random';

/** How the demo scouts sample each crop: unit, stops and units per stop (demo choices). */
export const DEMO_PLANS: Record<string, { unit: string; stops: number; perStop: number }> = {
	soybean: { unit: 'plant', stops: 20, perStop: 1 },
	wheat: { unit: 'tiller', stops: 10, perStop: 5 },
	'potato-seed': { unit: 'plant', stops: 20, perStop: 1 },
	'sugar-beet': { unit: 'plant', stops: 20, perStop: 1 },
	canola: { unit: 'plant', stops: 20, perStop: 1 },
	'field-pea': { unit: 'sweep', stops: 10, perStop: 1 }
};

/** Growth stage (BBCH) ranges the demo season walks through, per crop. */
const STAGES: Record<string, [number, number]> = {
	soybean: [55, 75],
	wheat: [43, 59],
	'potato-seed': [40, 65],
	'sugar-beet': [12, 19],
	canola: [57, 75],
	'field-pea': [66, 79]
};

export interface DemoCount {
	stopNo: number;
	unitNo: number;
	aphids: number;
	alate: number;
}

export interface DemoVisit {
	visitedOn: string;
	bbch: number;
	counts: DemoCount[];
	mummies: number;
	ladybeetles: number;
	lacewings: number;
	hoverflies: number;
	airTempC: number;
}

export const isoDay = (d: Date) => formatISO(d, { representation: 'date' });

/** A season of visits for one demo block: logistic growth with aggregated (NB) counts. */
export function demoVisits(
	r: Rng,
	crop: string,
	start: number,
	growth: number,
	firstDay: Date,
	visits: number,
	everyDays: number
): DemoVisit[] {
	const plan = DEMO_PLANS[crop];
	const [s0, s1] = STAGES[crop];
	const cap = crop === 'soybean' ? 1_200 : 80;
	const out: DemoVisit[] = [];
	for (let v = 0; v < visits; v++) {
		const day = v * everyDays + r.int(0, 1);
		const m = cap / (1 + ((cap - start) / start) * Math.exp(-growth * day));
		const counts: DemoCount[] = [];
		let total = 0;
		for (let s = 1; s <= plan.stops; s++) {
			for (let u = 1; u <= plan.perStop; u++) {
				const aphids = r.negbin(m, 1.2);
				const alate = aphids ? Math.min(aphids, r.poisson(aphids * 0.03)) : 0;
				total += aphids;
				counts.push({ stopNo: s, unitNo: u, aphids, alate });
			}
		}
		out.push({
			visitedOn: isoDay(addDays(firstDay, day)),
			bbch: Math.round(s0 + ((s1 - s0) * v) / Math.max(1, visits - 1)),
			counts,
			mummies: r.poisson(total * 0.02),
			ladybeetles: r.poisson(0.3 + v * 0.2),
			lacewings: r.poisson(0.2),
			hoverflies: r.poisson(0.1 + v * 0.1),
			airTempC: Math.round((20 + r.normal() * 3) * 10) / 10
		});
	}
	return out;
}

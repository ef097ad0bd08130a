import { linearFit, tQuantile } from './stats';

export interface TrendPoint {
	/** Day number, or cumulative degree-days. */
	x: number;
	/** Mean aphids per unit (>= 0). */
	value: number;
	/** Units counted, for the zero replacement. */
	n: number;
}

export interface TrendFit {
	basis: 'days' | 'degree-days';
	points: number;
	/** Growth rate per day (or per degree-day): slope of ln(density). */
	r: number;
	rCi95: [number, number] | null;
	/** ln 2 / r when rising, else null. */
	doubling: number | null;
	/** 95 % interval of the doubling time; a null end is unbounded. */
	doublingCi95: [number | null, number | null] | null;
	halving: number | null;
	rising: boolean;
	/** The r interval excludes zero. */
	significant: boolean;
	r2: number | null;
	lastX: number;
	/** Density the forecast starts from: the latest point after zero handling. */
	anchor: number;
	droppedLeadingZeros: number;
	replacedZeros: number;
}

export const ZERO_HANDLING =
	'visits before the first aphids are left out; a later zero count is taken as half an aphid over the units counted';

/** Log-linear least-squares fit of density over time (exponential growth). */
export function fitExponential(
	points: readonly TrendPoint[],
	basis: TrendFit['basis'] = 'days'
): TrendFit | null {
	let first = 0;
	while (first < points.length && points[first].value <= 0) first++;
	const m = points.length - first;
	if (m < 2) return null;
	const xs = new Float64Array(m);
	const ys = new Float64Array(m);
	let replaced = 0;
	for (let i = 0; i < m; i++) {
		const p = points[first + i];
		let v = p.value;
		if (v <= 0) {
			v = 0.5 / Math.max(1, p.n);
			replaced++;
		}
		xs[i] = p.x;
		ys[i] = Math.log(v);
	}
	const fit = linearFit(xs, ys, m);
	if (!fit) return null;
	const r = fit.slope;
	let rCi: [number, number] | null = null;
	if (fit.seSlope !== null) {
		const half = tQuantile(0.975, m - 2) * fit.seSlope;
		rCi = [r - half, r + half];
	}
	const ln2 = Math.LN2;
	return {
		basis,
		points: m,
		r,
		rCi95: rCi,
		doubling: r > 0 ? ln2 / r : null,
		doublingCi95:
			rCi && r > 0 ? [rCi[1] > 0 ? ln2 / rCi[1] : null, rCi[0] > 0 ? ln2 / rCi[0] : null] : null,
		halving: r < 0 ? ln2 / -r : null,
		rising: r > 0,
		significant: rCi !== null && (rCi[0] > 0 || rCi[1] < 0),
		r2: fit.r2,
		lastX: xs[m - 1],
		anchor: Math.exp(ys[m - 1]),
		droppedLeadingZeros: first,
		replacedZeros: replaced
	};
}

/** Time (days or degree-days) from the last visit until density reaches `target`. */
export function timeToReach(
	trend: TrendFit,
	target: number,
	from = trend.anchor
): { estimate: number; ci95: [number | null, number | null] | null } | null {
	if (from >= target) return { estimate: 0, ci95: [0, 0] };
	if (!(trend.r > 0) || !(target > 0) || !(from > 0)) return null;
	const gap = Math.log(target / from);
	const ci = trend.rCi95;
	return {
		estimate: gap / trend.r,
		ci95: ci ? [ci[1] > 0 ? gap / ci[1] : null, ci[0] > 0 ? gap / ci[0] : null] : null
	};
}

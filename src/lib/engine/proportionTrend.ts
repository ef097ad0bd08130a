import { linearFit } from './stats';

export interface ProportionPoint {
	day: number;
	infested: number;
	n: number;
}

export interface ProportionTrend {
	/** Slope of ln(-ln(1 - P)) per day. */
	slope: number;
	points: number;
	lastDay: number;
	anchor: number;
	/** The latest point on the transformed scale. */
	anchorScaled: number;
}

const cloglog = (p: number) => Math.log(-Math.log1p(-p));

// Kept off 0 and 1 by half a unit so the transform stays finite.
const bounded = (k: number, n: number) => Math.min(n - 0.5, Math.max(0.5, k)) / n;

/**
 * Trend of the proportion infested on the complementary log-log scale: under the empirical
 * binomial model ln(-ln(1 - P)) = a + b ln(m), exponential growth in m is linear in time there.
 */
export function fitProportionTrend(points: readonly ProportionPoint[]): ProportionTrend | null {
	if (points.length < 2) return null;
	const xs = points.map((p) => p.day);
	const ys = points.map((p) => cloglog(bounded(p.infested, p.n)));
	const fit = linearFit(xs, ys);
	if (!fit) return null;
	const last = points[points.length - 1];
	return {
		slope: fit.slope,
		points: points.length,
		lastDay: last.day,
		anchor: last.infested / last.n,
		anchorScaled: ys[ys.length - 1]
	};
}

/** Days from the last visit until the proportion infested reaches `target`, or null. */
export function daysToProportion(t: ProportionTrend, target: number): number | null {
	if (t.anchor >= target) return 0;
	if (!(t.slope > 0) || target >= 1) return null;
	return Math.max(0, (cloglog(target) - t.anchorScaled) / t.slope);
}

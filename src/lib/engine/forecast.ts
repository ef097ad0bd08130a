import { isoPlusDays } from './dates';
import { ddAt, recentDdPerDay, type DdSeries } from './degreeDays';
import { daysToProportion, fitProportionTrend } from './proportionTrend';
import type { SampleSummary } from './sample';
import { fitExponential, timeToReach, type TrendFit } from './trend';
import type { ThresholdRule } from './types';

export interface Forecast {
	basis: 'days';
	horizonDays: number;
	/** Days from asOf (0 when already reached), null when not forecast to reach it. */
	daysToAction: number | null;
	daysToInjury: number | null;
	actionDate: string | null;
	injuryDate: string | null;
	/** Dates from the 95 % interval of r; a null end is unbounded. */
	actionDateCi95: [string | null, string | null] | null;
	injuryDateCi95: [string | null, string | null] | null;
	degreeDays: {
		ddPerDayRecent: number;
		ddToAction: number | null;
		ddToInjury: number | null;
		/** Dates assuming the recent degree-days per day continue. */
		actionDate: string | null;
		injuryDate: string | null;
	} | null;
}

/** Exponential fit over the latest counted visits, on days and optionally on degree-days. */
export function fitTrends(
	window: readonly SampleSummary[],
	days: readonly number[],
	dd: DdSeries | null
): { days: TrendFit | null; dd: TrendFit | null } {
	const idx = window.flatMap((v, i) => (v.mean === null ? [] : [i]));
	const byDay = fitExponential(
		idx.map((i) => ({ x: days[i], value: window[i].mean!, n: window[i].counted }))
	);
	let ddFit: TrendFit | null = null;
	if (dd) {
		const pts = idx.map((i) => ({
			x: ddAt(dd, days[i]),
			value: window[i].mean!,
			n: window[i].counted
		}));
		if (pts.every((p) => p.x !== null))
			ddFit = fitExponential(pts as { x: number; value: number; n: number }[], 'degree-days');
	}
	return { days: byDay, dd: ddFit };
}

const dateAt = (asOf: string, lag: number, d: number | null) =>
	d === null ? null : isoPlusDays(asOf, Math.ceil(d - lag));

/** When the density (rule units) reaches the action threshold and the injury level. */
export function forecastCrossings(
	rule: ThresholdRule,
	factor: number,
	trend: TrendFit | null,
	window: readonly SampleSummary[],
	days: readonly number[],
	asOf: string,
	lag: number,
	horizonDays: number,
	ddTrend: TrendFit | null,
	dd: DdSeries | null,
	asOfDay: number
): Forecast {
	const out: Forecast = {
		basis: 'days',
		horizonDays,
		daysToAction: null,
		daysToInjury: null,
		actionDate: null,
		injuryDate: null,
		actionDateCi95: null,
		injuryDateCi95: null,
		degreeDays: null
	};
	const since = (d: number | null) => (d === null ? null : Math.max(0, d - lag));
	if (rule.metric === 'proportion') {
		const t = fitProportionTrend(
			window.map((v, i) => ({ day: days[i], infested: v.infested, n: v.n }))
		);
		const d = t ? daysToProportion(t, rule.action) : null;
		const di = t && rule.injury !== undefined ? daysToProportion(t, rule.injury) : null;
		return {
			...out,
			daysToAction: since(d),
			actionDate: dateAt(asOf, lag, d),
			daysToInjury: since(di),
			injuryDate: dateAt(asOf, lag, di)
		};
	}
	if (!trend) return out;
	const ci = (c: [number | null, number | null] | null | undefined) =>
		c
			? ([dateAt(asOf, lag, c[0]), dateAt(asOf, lag, c[1])] as [string | null, string | null])
			: null;
	const a = timeToReach(trend, rule.action / factor);
	out.daysToAction = since(a?.estimate ?? null);
	out.actionDate = dateAt(asOf, lag, a?.estimate ?? null);
	out.actionDateCi95 = ci(a?.ci95);
	if (rule.injury !== undefined) {
		const i = timeToReach(trend, rule.injury / factor);
		out.daysToInjury = since(i?.estimate ?? null);
		out.injuryDate = dateAt(asOf, lag, i?.estimate ?? null);
		out.injuryDateCi95 = ci(i?.ci95);
	}
	const rate = dd ? recentDdPerDay(dd, asOfDay) : null;
	if (ddTrend && rate !== null && rate > 0) {
		const ddA = timeToReach(ddTrend, rule.action / factor)?.estimate ?? null;
		const ddI =
			rule.injury !== undefined
				? (timeToReach(ddTrend, rule.injury / factor)?.estimate ?? null)
				: null;
		const when = (x: number | null) => (x === null ? null : dateAt(asOf, lag, x / rate));
		out.degreeDays = {
			ddPerDayRecent: rate,
			ddToAction: ddA,
			ddToInjury: ddI,
			actionDate: when(ddA),
			injuryDate: when(ddI)
		};
	}
	return out;
}

import { dayNumber, isoPlusDays, type Assessment, type SampleSummary } from '$lib/engine';

export interface SeriesPoint {
	date: string;
	day: number;
	y: number;
	lo: number | null;
	hi: number | null;
}

export interface SeasonSeries {
	/** What y is: "aphids per plant", "share of plants infested". */
	unit: string;
	proportion: boolean;
	points: SeriesPoint[];
	action: number | null;
	injury: number | null;
	ruleLabel: string | null;
	/** Exponential trend carried from the last visit to the next one, with the 95 % band of r. */
	forecast: SeriesPoint[];
	nextVisit: string | null;
}

/** The rule's unit per sample unit: 1, or units per plant when a per-plant rule is applied. */
function factorFor(a: Assessment, s: SampleSummary) {
	const rule = a.rule;
	if (!rule || rule.metric === 'proportion' || rule.sampleUnit === s.sampleUnit) return 1;
	return s.unitsPerPlant ?? 1;
}

/** Chart data from an assessment: density per visit, thresholds and the forecast to next visit. */
export function seasonSeries(a: Assessment): SeasonSeries {
	const rule = a.rule;
	const proportion = rule?.metric === 'proportion';
	const points: SeriesPoint[] = [];
	for (const s of a.perVisit) {
		const day = dayNumber(s.date, 'date');
		if (proportion) {
			points.push({
				date: s.date,
				day,
				y: s.proportionInfested,
				lo: s.proportionCi95[0],
				hi: s.proportionCi95[1]
			});
		} else if (s.mean !== null) {
			const f = factorFor(a, s);
			points.push({
				date: s.date,
				day,
				y: s.mean * f,
				lo: s.ci95 ? s.ci95[0] * f : null,
				hi: s.ci95 ? s.ci95[1] * f : null
			});
		}
	}
	const last = a.perVisit[a.perVisit.length - 1];
	const horizon = a.forecast?.horizonDays ?? 7;
	const nextVisit = last ? isoPlusDays(a.asOf, horizon) : null;
	const forecast: SeriesPoint[] = [];
	const t = a.trend;
	if (!proportion && t && last && nextVisit) {
		const f = factorFor(a, last);
		const end = dayNumber(nextVisit, 'next');
		const [rLo, rHi] = t.rCi95 ?? [t.r, t.r];
		for (let d = t.lastX; d <= end; d++) {
			const dt = d - t.lastX;
			forecast.push({
				date: isoPlusDays('1970-01-01', d),
				day: d,
				y: t.anchor * Math.exp(t.r * dt) * f,
				lo: t.anchor * Math.exp(rLo * dt) * f,
				hi: t.anchor * Math.exp(rHi * dt) * f
			});
		}
	}
	const unitName = rule?.sampleUnit ?? last?.sampleUnit ?? 'unit';
	return {
		unit: proportion ? `share of ${unitName}s infested` : `aphids per ${unitName}`,
		proportion,
		points,
		action: rule?.action ?? null,
		injury: rule?.injury ?? null,
		ruleLabel: rule?.label ?? null,
		forecast,
		nextVisit
	};
}

/** Round, readable tick values for an axis from 0 to max. */
export function niceTicks(max: number, count = 5): number[] {
	if (!(max > 0)) return [0, 1];
	const raw = max / count;
	const mag = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
	const out: number[] = [];
	for (let v = 0; v <= max + step * 0.001; v += step) out.push(Math.round(v * 1e6) / 1e6);
	if (out[out.length - 1] < max) out.push(out[out.length - 1] + step);
	return out;
}

import { fmtNum, fmtPct, trendPhrase, type Assessment } from '../../engine';

export type Figure = [label: string, value: string];

/** The numbers behind a level, in words, for e-mail; each line only when the engine has it. */
export function assessmentFigures(a: Omit<Assessment, 'perVisit'>): Figure[] {
	const out: Figure[] = [];
	const l = a.latest;
	const unit = l?.sampleUnit || a.rule?.sampleUnit || 'unit';
	if (l?.mean !== null && l?.mean !== undefined) {
		const ci = l.ci95 ? ` (95 % CI ${fmtNum(l.ci95[0])}–${fmtNum(l.ci95[1])})` : '';
		out.push([
			'Latest density',
			`${fmtNum(l.mean)} aphids per ${unit}${ci}, ${l.n} units, ${l.date}`
		]);
	}
	if (l) out.push(['Units infested', `${fmtPct(l.proportionInfested)} of ${l.n}`]);
	if (a.rule) {
		const what =
			a.rule.metric === 'proportion'
				? fmtPct(a.rule.action) + ' of units'
				: `${fmtNum(a.rule.action)} per ${a.rule.sampleUnit}`;
		out.push(['Action threshold', `${what} (${a.rule.label}; source: ${a.rule.source})`]);
	}
	out.push(['Trend', trendPhrase(a.trend)]);
	if (a.forecast?.daysToAction !== null && a.forecast?.daysToAction !== undefined) {
		out.push([
			'Forecast',
			a.forecast.daysToAction === 0
				? 'at or above the action threshold now'
				: `reaches the action threshold in about ${fmtNum(a.forecast.daysToAction)} days (${a.forecast.actionDate})`
		]);
	}
	if (a.cad > 0) out.push(['Cumulative aphid-days', `${fmtNum(a.cad)} ${a.cadUnit}`]);
	if (a.yieldLoss?.percent !== null && a.yieldLoss?.percent !== undefined) {
		const kg = a.yieldLoss.kgPerHa !== null ? `, about ${fmtNum(a.yieldLoss.kgPerHa)} kg/ha` : '';
		out.push(['Yield loss (empirical relation)', `${fmtNum(a.yieldLoss.percent)} %${kg}`]);
	}
	if (a.sapDrain) {
		out.push([
			'Sap drain (direct, an estimate)',
			`${fmtNum(a.sapDrain.daily.sapLPerHaDay)} L sap and ${fmtNum(a.sapDrain.daily.sugarKgPerHaDay)} kg sugar per ha per day`
		]);
	}
	return out;
}

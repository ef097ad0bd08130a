import { cumulativeAphidDays, yieldLoss, type YieldLoss } from './cad';
import { dayNumber } from './dates';
import { cumulativeDd, type DdSeries } from './degreeDays';
import { DEFAULT_ENEMY_RULES, readEnemies, type EnemyReading } from './enemies';
import { EngineInputError, finite, positive } from './errors';
import { fitTrends, forecastCrossings, type DatedSummary, type Forecast } from './forecast';
import { trendPhrase } from './format';
import { decideLevel } from './level';
import { LEVELS } from './levels';
import { selectRule } from './rules';
import { summarizeSample, type SampleSummary } from './sample';
import { seasonDrain, type SapDrainReport } from './seasonDrain';
import { ZERO_HANDLING, type TrendFit } from './trend';
import type { AssessBlockInput, Assumption, LevelKey, ThresholdRule } from './types';

export interface VisitSummary extends SampleSummary {
	id: string | number | null;
	bbch: number | null;
}

export interface Assessment {
	asOf: string;
	level: LevelKey;
	label: string;
	rank: 0 | 1 | 2 | 3;
	reason: string;
	rule: ThresholdRule | null;
	/** Latest density in the rule's unit (or proportion for proportion rules). */
	value: number | null;
	latest: VisitSummary | null;
	trend: TrendFit | null;
	trendDegreeDays: TrendFit | null;
	forecast: Forecast | null;
	/** Cumulative aphid-days, first to last visit; per plant when units per plant are known. */
	cad: number;
	cadUnit: string;
	yieldLoss: YieldLoss | null;
	sapDrain: SapDrainReport | null;
	enemies: EnemyReading;
	assumptions: Assumption[];
	perVisit: VisitSummary[];
}

const note = (
	name: string,
	value: number | string,
	unit: string,
	source: string,
	provenance: Assumption['provenance']
): Assumption => ({ name, value, unit, source, provenance });

/** Assess one block: level, reason, trend, forecast, CAD, yield loss, sap drain, enemies. */
export function assessBlock(input: AssessBlockInput): Assessment {
	const { crop, pest, block } = input;
	const asOfDay = dayNumber(input.asOf, 'asOf');
	positive(block.areaHa, 'block.areaHa');
	positive(block.plantsPerHa, 'block.plantsPerHa');
	const horizon =
		block.rescoutDays === undefined ? 7 : positive(block.rescoutDays, 'block.rescoutDays');
	const window = input.trendWindow ?? 4;
	if (!Number.isInteger(window) || window < 2)
		throw new EngineInputError('trendWindow', 'must be a whole number of 2 or more');
	if (!Array.isArray(input.visits)) throw new EngineInputError('visits', 'must be a list');
	const assumptions: Assumption[] = [];
	const visits = input.visits;
	const last = visits[visits.length - 1];
	const uppFor = (unit: string): number | null => {
		if (unit === 'plant') return 1;
		if (block.unitsPerPlant !== undefined)
			return positive(block.unitsPerPlant, 'block.unitsPerPlant');
		return input.sampleUnits?.find((u) => u.code === unit)?.unitsPerPlantDefault ?? null;
	};
	if (last) {
		dayNumber(last.date, `visits[${visits.length - 1}].date`);
		if (last.bbch !== undefined) finite(last.bbch, `visits[${visits.length - 1}].bbch`);
	}
	const match = last
		? selectRule(input.thresholds, crop, pest, last, uppFor(last.sampleUnit))
		: null;
	const rule = match?.rule ?? null;
	const tally = rule?.metric === 'proportion' ? (rule.tallyThreshold ?? 1) : 1;
	let prevDay = -Infinity;
	const perVisit: (VisitSummary & { day: number })[] = visits.map((v, i) => {
		const f = `visits[${i}]`;
		const day = dayNumber(v.date, `${f}.date`);
		if (day < prevDay) throw new EngineInputError(`${f}.date`, 'visits must be in date order');
		if (day > asOfDay) throw new EngineInputError(`${f}.date`, 'is after asOf');
		if (v.bbch !== undefined) finite(v.bbch, `${f}.bbch`);
		prevDay = day;
		const s = summarizeSample(v, {
			tallyThreshold: tally,
			unitsPerPlant: uppFor(v.sampleUnit),
			field: f
		});
		return { ...s, id: v.id ?? null, bbch: v.bbch ?? null, day };
	});
	const latest = perVisit.length ? perVisit[perVisit.length - 1] : null;
	const enemies = readEnemies(latest, input.enemyRules ?? DEFAULT_ENEMY_RULES);
	let dd: DdSeries | null = null;
	if (input.weather && input.weather.length) {
		dd = cumulativeDd(input.weather, pest.baseTempC.value, pest.upperTempC?.value);
		const b = pest.baseTempC;
		assumptions.push(note('degree-day base', b.value, 'degC', b.source, b.provenance));
	}
	const same = latest ? perVisit.filter((v) => v.sampleUnit === latest.sampleUnit) : [];
	const recent = same.slice(-window) as DatedSummary[];
	const trends = fitTrends(recent, dd);
	assumptions.push(
		note(
			'trend',
			`log-linear fit over the last ${window} visits`,
			'',
			ZERO_HANDLING,
			'common practice'
		)
	);
	const lag = latest ? asOfDay - latest.day : 0;
	const forecast =
		rule && match
			? forecastCrossings(
					rule,
					match.factor,
					trends.days,
					recent,
					input.asOf,
					lag,
					horizon,
					trends.dd,
					dd,
					asOfDay
				)
			: null;
	let value: number | null = null;
	if (rule && latest)
		value =
			rule.metric === 'proportion'
				? latest.proportionInfested
				: latest.mean === null
					? null
					: latest.mean * match!.factor;
	if (rule) {
		assumptions.push(note('threshold', rule.label, rule.sampleUnit, rule.source, rule.provenance));
		if (match!.stageUnchecked)
			assumptions.push(
				note('growth stage', 'not recorded', 'BBCH', 'stage range not checked', 'assumption')
			);
	}
	assumptions.push(
		note(
			'forecast horizon',
			horizon,
			'days',
			block.rescoutDays === undefined ? 'default re-scout interval' : 'block re-scout interval',
			block.rescoutDays === undefined ? 'common practice' : 'assumption'
		)
	);
	// The soybean rule's 80 % is of plants with any aphids, whatever the rule's tally.
	const proportion =
		rule?.alsoProportion !== undefined && latest ? latest.proportionInfested : null;
	const decided = latest
		? decideLevel({
				rule,
				value,
				unitLabel: `per ${rule?.sampleUnit ?? latest.sampleUnit}`,
				proportion,
				rising: trends.days ? trends.days.rising : null,
				trendText: trendPhrase(trends.days),
				daysToAction: forecast?.daysToAction ?? null,
				daysToInjury: forecast?.daysToInjury ?? null,
				actionDate: forecast?.actionDate ?? null,
				injuryDate: forecast?.injuryDate ?? null,
				horizonDays: horizon,
				enemies
			})
		: { level: 'calm' as const, reason: 'No scouting visits yet' };
	const uppLatest = latest?.unitsPerPlant ?? null;
	const cadPoints = same.filter((v) => v.mean !== null).map((v) => ({
		day: v.day,
		density: v.mean === null ? 0 : v.mean * (v.unitsPerPlant ?? 1)
	}));
	const cad = cumulativeAphidDays(cadPoints);
	const peak = same.reduce((m, v) => Math.max(m, v.mean ?? 0), 0);
	const loss =
		pest.yieldLoss?.kind === 'percent-per-cad' && uppLatest === null
			? null
			: yieldLoss(pest, cad, peak, block.expectedYieldKgHa, block.pricePerKg);
	const sapDrain = uppLatest === null || latest?.mean == null ? null : seasonDrain(cadPoints, input, cad);
	const lv = LEVELS.find((l) => l.key === decided.level)!;
	return {
		asOf: input.asOf,
		level: lv.key,
		label: lv.label,
		rank: lv.rank,
		reason: decided.reason,
		rule,
		value,
		latest: latest ? strip(latest) : null,
		trend: trends.days,
		trendDegreeDays: trends.dd,
		forecast,
		cad,
		cadUnit:
			uppLatest === null
				? `aphid-days per ${latest?.sampleUnit ?? 'unit'}`
				: 'aphid-days per plant',
		yieldLoss: loss,
		sapDrain,
		enemies,
		assumptions,
		perVisit: perVisit.map(strip)
	};
}

function strip(v: VisitSummary & { day: number }): VisitSummary {
	const { day: _day, ...rest } = v;
	return rest;
}

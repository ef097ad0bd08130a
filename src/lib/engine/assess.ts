import type { YieldLoss } from './cad';
import { seasonCosts } from './costs';
import { dayNumber } from './dates';
import { cumulativeDd, type DdSeries } from './degreeDays';
import { DEFAULT_ENEMY_RULES, readEnemies, type EnemyReading } from './enemies';
import { EngineInputError, positive } from './errors';
import { fitTrends, forecastCrossings, type Forecast } from './forecast';
import { trendPhrase } from './format';
import { decideLevel } from './level';
import { LEVELS } from './levels';
import { selectRule } from './rules';
import type { SampleSummary } from './sample';
import type { SapDrainReport } from './seasonDrain';
import { ZERO_HANDLING, type TrendFit } from './trend';
import type { AssessBlockInput, Assumption, LevelKey, ThresholdRule } from './types';
import { checkVisit, prepareVisits, sameUnit, unitsPerPlantFor } from './visits';

export interface Assessment {
	asOf: string;
	level: LevelKey;
	label: string;
	rank: 0 | 1 | 2 | 3;
	reason: string;
	rule: ThresholdRule | null;
	/** Latest density in the rule's unit (or the proportion for proportion rules). */
	value: number | null;
	latest: SampleSummary | null;
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
	perVisit: SampleSummary[];
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
	const last = input.visits[input.visits.length - 1];
	if (last) checkVisit(last, input.visits.length - 1);
	const match = last
		? selectRule(input.thresholds, crop, pest, last, unitsPerPlantFor(input, last.sampleUnit))
		: null;
	const rule = match?.rule ?? null;
	const all = prepareVisits(
		input,
		asOfDay,
		rule?.metric === 'proportion' ? (rule.tallyThreshold ?? 1) : 1
	);
	const same = sameUnit(all);
	const latest = all.summaries[all.summaries.length - 1] ?? null;
	const enemies = readEnemies(latest, input.enemyRules ?? DEFAULT_ENEMY_RULES);
	const assumptions: Assumption[] = [
		note(
			'trend',
			`log-linear fit over the last ${window} visits`,
			'',
			ZERO_HANDLING,
			'common practice'
		)
	];
	let dd: DdSeries | null = null;
	if (input.weather && input.weather.length) {
		dd = cumulativeDd(input.weather, pest.baseTempC.value, pest.upperTempC?.value);
		assumptions.push(
			note(
				'degree-day base',
				pest.baseTempC.value,
				'degC',
				pest.baseTempC.source,
				pest.baseTempC.provenance
			)
		);
	}
	const recent = same.summaries.slice(-window);
	const recentDays = same.days.slice(-window);
	const trends = fitTrends(recent, recentDays, dd);
	const lag = latest ? asOfDay - all.days[all.days.length - 1] : 0;
	const forecast = match
		? forecastCrossings(
				match.rule,
				match.factor,
				trends.days,
				recent,
				recentDays,
				input.asOf,
				lag,
				horizon,
				trends.dd,
				dd,
				asOfDay
			)
		: null;
	let value: number | null = null;
	if (match && latest)
		value =
			match.rule.metric === 'proportion'
				? latest.proportionInfested
				: latest.mean === null
					? null
					: latest.mean * match.factor;
	if (match) {
		assumptions.push(
			note(
				'threshold',
				match.rule.label,
				match.rule.sampleUnit,
				match.rule.source,
				match.rule.provenance
			)
		);
		if (match.stageUnchecked)
			assumptions.push(
				note('growth stage', 'not recorded', 'BBCH', 'stage range not checked', 'assumption')
			);
	}
	const own = block.rescoutDays !== undefined;
	assumptions.push(
		note(
			'forecast horizon',
			horizon,
			'days',
			own ? 'block re-scout interval' : 'default re-scout interval',
			own ? 'assumption' : 'common practice'
		)
	);
	// The soybean rule's 80 % is of plants with any aphids, so the tally-1 share is used.
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
	const costs = seasonCosts(same, input, latest);
	const lv = LEVELS.find((l) => l.key === decided.level)!;
	return {
		asOf: input.asOf,
		level: lv.key,
		label: lv.label,
		rank: lv.rank,
		reason: decided.reason,
		rule,
		value,
		latest,
		trend: trends.days,
		trendDegreeDays: trends.dd,
		forecast,
		...costs,
		enemies,
		assumptions,
		perVisit: all.summaries
	};
}

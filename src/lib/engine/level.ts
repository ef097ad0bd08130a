import { shortDate } from './dates';
import type { EnemyReading } from './enemies';
import { fmtNum, fmtPct } from './format';
import type { LevelKey, ThresholdRule } from './types';

export interface LevelInputs {
	rule: ThresholdRule | null;
	/** Density in the rule's unit, or the proportion infested for proportion rules. */
	value: number | null;
	unitLabel: string;
	/** Share infested against rule.alsoProportion; null when the rule has none. */
	proportion: number | null;
	/** null when there is no trend yet. */
	rising: boolean | null;
	trendText: string;
	daysToAction: number | null;
	daysToInjury: number | null;
	actionDate: string | null;
	injuryDate: string | null;
	horizonDays: number;
	enemies: EnemyReading;
}

export interface LevelResult {
	level: LevelKey;
	reason: string;
}

const show = (rule: ThresholdRule, v: number) =>
	rule.metric === 'proportion' ? fmtPct(v) : fmtNum(v);

/** The level and a one-line reason, from density, trend, forecast and natural enemies. */
export function decideLevel(x: LevelInputs): LevelResult {
	const { rule, value } = x;
	if (!rule)
		return { level: 'calm', reason: 'No action threshold for this crop, pest, unit and stage' };
	if (value === null) return { level: 'calm', reason: `No counts to compare with ${rule.label}` };
	const head =
		rule.metric === 'proportion'
			? `${fmtPct(value)} of units infested, ${x.trendText}`
			: `${fmtNum(value)} ${x.unitLabel}${x.proportion !== null ? ` (${fmtPct(x.proportion)} infested)` : ''}, ${x.trendText}`;
	const by = (level: number, date: string | null) =>
		`reaches ${show(rule, level)} by ${date ? shortDate(date) : '?'}`;
	const held = x.enemies.holdsGrowth;
	const within = (d: number | null) => d !== null && d <= x.horizonDays && !held;
	const enemyNote = x.enemies.advice === 'unknown' ? '' : `; ${x.enemies.note}`;
	const injury = rule.injury;

	if (injury !== undefined && value >= injury) {
		return {
			level: 'severe',
			reason: `${head}; at or above the injury level of ${show(rule, injury)}`
		};
	}
	const proportionOk =
		rule.alsoProportion === undefined || (x.proportion ?? 0) >= rule.alsoProportion;
	if (value >= rule.action && proportionOk) {
		if (rule.requiresRising && x.rising === false) {
			return {
				level: 'stirring',
				reason: `${head}; at the action threshold but not rising${enemyNote}`
			};
		}
		if (injury !== undefined && within(x.daysToInjury)) {
			return { level: 'severe', reason: `${head}; ${by(injury, x.injuryDate)}` };
		}
		if (x.enemies.holdsAction) {
			return {
				level: 'stirring',
				reason: `${head}; at the action threshold, held back: ${x.enemies.note}`
			};
		}
		const confirm =
			rule.requiresRising && x.rising === null
				? '; confirm it is rising on a re-scout in 3-4 days'
				: '';
		return {
			level: 'action',
			reason: `${head}; at or above the action threshold of ${show(rule, rule.action)}${confirm}${enemyNote}`
		};
	}
	if (value >= rule.action) {
		const share = fmtPct(rule.alsoProportion ?? 0);
		return { level: 'stirring', reason: `${head}; fewer than ${share} of units infested yet` };
	}
	if (within(x.daysToAction)) {
		return { level: 'stirring', reason: `${head}; ${by(rule.action, x.actionDate)}` };
	}
	const note = held ? `; ${x.enemies.note}` : '';
	return { level: 'calm', reason: `${head}; below ${show(rule, rule.action)}${note}` };
}

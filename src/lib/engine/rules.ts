import { EngineInputError, positive } from './errors';
import type { CropParams, PestParams, ThresholdRule, VisitInput } from './types';

export interface RuleMatch {
	rule: ThresholdRule;
	/** Multiply a per-unit mean by this to get the rule's unit (1, or units per plant). */
	factor: number;
	/** The visit had no growth stage, so the stage range was not checked. */
	stageUnchecked: boolean;
}

/** Rules may come edited from the database: check the numbers the level rests on. */
export function checkRule(r: ThresholdRule, i: number): void {
	const f = `thresholds[${i}]`;
	positive(r.action, `${f}.action`);
	if (r.metric === 'proportion' && r.action > 1)
		throw new EngineInputError(`${f}.action`, 'a proportion must be at most 1');
	if (r.injury !== undefined && !(positive(r.injury, `${f}.injury`) > r.action)) {
		throw new EngineInputError(`${f}.injury`, 'must be above the action threshold');
	}
	if (r.alsoProportion !== undefined && !(positive(r.alsoProportion, `${f}.alsoProportion`) <= 1)) {
		throw new EngineInputError(`${f}.alsoProportion`, 'must be at most 1');
	}
	const t = r.tallyThreshold;
	if (t !== undefined && (!Number.isInteger(t) || t < 1)) {
		throw new EngineInputError(`${f}.tallyThreshold`, 'must be a whole number of 1 or more');
	}
}

/**
 * The threshold rule for a visit: same crop and pest, growth stage inside the BBCH range,
 * same sample unit; or a per-plant mean rule when units per plant are known.
 */
export function selectRule(
	rules: readonly ThresholdRule[],
	crop: CropParams,
	pest: PestParams,
	visit: VisitInput,
	unitsPerPlant: number | null
): RuleMatch | null {
	let converted: RuleMatch | null = null;
	const stageUnchecked = visit.bbch === undefined;
	for (let i = 0; i < rules.length; i++) {
		const rule = rules[i];
		if (rule.cropCode !== crop.code || rule.pestCode !== pest.code) continue;
		if (!stageUnchecked && (visit.bbch! < rule.bbchFrom || visit.bbch! > rule.bbchTo)) continue;
		const md = visit.date.slice(5);
		if ((rule.seasonFrom && md < rule.seasonFrom) || (rule.seasonTo && md > rule.seasonTo))
			continue;
		if (rule.sampleUnit === visit.sampleUnit) {
			checkRule(rule, i);
			return { rule, factor: 1, stageUnchecked };
		}
		if (
			!converted &&
			rule.metric === 'mean' &&
			rule.sampleUnit === 'plant' &&
			unitsPerPlant !== null
		) {
			checkRule(rule, i);
			converted = { rule, factor: unitsPerPlant, stageUnchecked };
		}
	}
	return converted;
}

import type { CropParams, PestParams, ThresholdRule, VisitInput } from './types';

export interface RuleMatch {
	rule: ThresholdRule;
	/** Multiply a per-unit mean by this to get the rule's unit (1, or units per plant). */
	factor: number;
	/** The visit had no growth stage, so the stage range was not checked. */
	stageUnchecked: boolean;
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
	for (const rule of rules) {
		if (rule.cropCode !== crop.code || rule.pestCode !== pest.code) continue;
		if (!stageUnchecked && (visit.bbch! < rule.bbchFrom || visit.bbch! > rule.bbchTo)) continue;
		const md = visit.date.slice(5);
		if ((rule.seasonFrom && md < rule.seasonFrom) || (rule.seasonTo && md > rule.seasonTo))
			continue;
		if (rule.sampleUnit === visit.sampleUnit) return { rule, factor: 1, stageUnchecked };
		if (
			!converted &&
			rule.metric === 'mean' &&
			rule.sampleUnit === 'plant' &&
			unitsPerPlant !== null
		) {
			converted = { rule, factor: unitsPerPlant, stageUnchecked };
		}
	}
	return converted;
}

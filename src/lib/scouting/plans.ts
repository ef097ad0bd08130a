import {
	batchDecide,
	sprtDecide,
	sprtProportion,
	summarizeSample,
	SPEED_SCOUTING_SOYBEAN,
	type Provenance,
	type StopLines,
	type ThresholdRule,
	type UnitCount
} from '$lib/engine';

export const PLAN_KEYS = ['count', 'speed-scouting', 'binomial-sprt'] as const;
export type PlanKey = (typeof PLAN_KEYS)[number];

/** How a scout samples a block on one visit: unit, how many, and what to record per unit. */
export interface SamplingPlan {
	key: PlanKey;
	name: string;
	sampleUnit: string;
	mode: 'count' | 'presence';
	/** A unit counts as infested at this many aphids (presence plans). */
	tallyThreshold: number | null;
	stops: number;
	perStop: number;
	/** Most units the plan may ask for (batch and sequential plans stop earlier). */
	maxUnits: number;
	/** Threshold in this unit for the live comparison, if the rule is a mean per this unit. */
	actionPerUnit: number | null;
	how: string;
	source: string;
	provenance: Provenance;
}

// Stops and units per stop by sample unit: Cornicle's defaults, not from a source.
const LAYOUT: Record<string, [number, number]> = {
	plant: [20, 1],
	tiller: [10, 5],
	ear: [10, 5],
	leaf: [20, 2],
	'compound-leaf': [10, 3],
	'plant-tip': [10, 3],
	sweep: [10, 1]
};
const LAYOUT_SOURCE = 'Cornicle default layout (common practice: spread stops across the block)';

const SPRT_SOURCE =
	'Wald SPRT with p0, p1 ten points either side of the action share and alpha = beta = 0.10 (assumption; set per organisation)';

/** The rule that applies at a growth stage (any stage when it is not known). */
export function ruleAt(rules: readonly ThresholdRule[], bbch: number | null) {
	return (
		rules.find((r) => bbch === null || (bbch >= r.bbchFrom && bbch <= r.bbchTo)) ?? rules[0] ?? null
	);
}

/** The plans a scout may follow on a block, the usual one first. */
export function plansFor(
	pestCode: string,
	rules: readonly ThresholdRule[],
	bbch: number | null
): SamplingPlan[] {
	const rule = ruleAt(rules, bbch);
	const unit = rule?.sampleUnit ?? 'plant';
	const [stops, perStop] = LAYOUT[unit] ?? [10, 1];
	const plans: SamplingPlan[] = [
		{
			key: 'count',
			name: 'Count every unit',
			sampleUnit: unit,
			mode: 'count',
			tallyThreshold: null,
			stops,
			perStop,
			maxUnits: stops * perStop,
			actionPerUnit: rule && rule.metric === 'mean' ? rule.action : null,
			how: `${stops} stops, ${perStop} ${perStop === 1 ? 'unit' : 'units'} at each; tally winged and wingless aphids`,
			source: LAYOUT_SOURCE,
			provenance: 'common practice'
		}
	];
	if (pestCode === 'soybean-aphid' && unit === 'plant') {
		const p = SPEED_SCOUTING_SOYBEAN;
		plans.push({
			key: 'speed-scouting',
			name: p.name,
			sampleUnit: 'plant',
			mode: 'presence',
			tallyThreshold: p.tallyThreshold.value,
			stops: p.max.value,
			perStop: 1,
			maxUnits: p.max.value,
			actionPerUnit: null,
			how: `plants 30 paces apart; a plant is infested at ${p.tallyThreshold.value} or more aphids (stop counting at ${p.tallyThreshold.value}); start with ${p.start.value}, add ${p.step.value} at a time up to ${p.max.value}`,
			source: p.tallyThreshold.source,
			provenance: p.tallyThreshold.provenance
		});
	}
	if (rule && rule.metric === 'proportion') {
		const tally = rule.tallyThreshold ?? 1;
		plans.push({
			key: 'binomial-sprt',
			name: 'Infested or clean, sequential',
			sampleUnit: unit,
			mode: 'presence',
			tallyThreshold: tally,
			stops: stops * perStop * 2,
			perStop: 1,
			maxUnits: stops * perStop * 2,
			actionPerUnit: null,
			how: `mark each ${unit} infested (${tally} or more aphids) or clean until the plan can decide`,
			source: SPRT_SOURCE,
			provenance: 'assumption'
		});
	}
	return plans;
}

function sprtLines(action: number): StopLines {
	const p0 = Math.max(0.01, action - 0.1);
	const p1 = Math.min(0.99, action + 0.1);
	return sprtProportion(p0, p1, { alpha: 0.1, beta: 0.1 });
}

export interface LiveDecision {
	stop: boolean;
	headline: string;
	detail: string;
	/** Units the plan still asks for (0 when it may stop). */
	more: number;
}

const isInfested = (u: UnitCount, tally: number) =>
	u.aphids !== undefined ? u.aphids >= tally : !!u.infested;

/** What the plan says after the units so far: keep sampling or stop, and why. */
export function liveDecision(
	plan: SamplingPlan,
	units: UnitCount[],
	rule: ThresholdRule | null
): LiveDecision {
	const n = units.length;
	if (plan.key === 'speed-scouting') {
		const infested = units.filter((u) => isInfested(u, plan.tallyThreshold ?? 1)).length;
		const a = batchDecide(SPEED_SCOUTING_SOYBEAN, n, infested);
		const stop = a.decision !== 'keep-sampling';
		return {
			stop,
			more: a.unitsStillNeeded,
			headline: stop ? `Stop: ${a.note}` : `Keep sampling: ${a.note}`,
			detail: `${infested} of ${n} plants infested (${plan.tallyThreshold}+ aphids)`
		};
	}
	if (plan.key === 'binomial-sprt') {
		const infested = units.filter((u) => isInfested(u, plan.tallyThreshold ?? 1)).length;
		const a = sprtDecide(sprtLines(rule?.action ?? 0.5), n, infested);
		const atMax = n >= plan.maxUnits;
		const stop = a.decision !== 'keep-sampling' || atMax;
		const why =
			a.decision === 'act'
				? 'the infested share is above the action threshold'
				: a.decision === 'no-action'
					? 'the infested share is below the action threshold'
					: atMax
						? 'the plan is used up without a decision; re-scout soon'
						: `at least ${a.unitsStillNeeded} more before a decision`;
		return {
			stop,
			more: stop ? 0 : a.unitsStillNeeded,
			headline: stop ? `Stop: ${why}` : `Keep sampling: ${why}`,
			detail: `${infested} of ${n} infested; stop lines at ${Math.max(0, a.lower).toFixed(1)} and ${a.upper.toFixed(1)}`
		};
	}
	const more = Math.max(0, plan.maxUnits - n);
	let detail = `${n} of ${plan.maxUnits} units counted`;
	if (n > 0) {
		const s = summarizeSample({ date: '2000-01-01', sampleUnit: plan.sampleUnit, units });
		detail += `; mean ${s.mean?.toFixed(1)} per ${plan.sampleUnit}`;
		if (s.ci95) detail += ` (95 % CI ${s.ci95[0].toFixed(1)} to ${s.ci95[1].toFixed(1)})`;
		if (plan.actionPerUnit !== null && s.ci95) {
			if (s.ci95[1] < plan.actionPerUnit) detail += `, clearly below ${plan.actionPerUnit}`;
			else if (s.ci95[0] > plan.actionPerUnit) detail += `, clearly above ${plan.actionPerUnit}`;
		}
	}
	return {
		stop: more === 0,
		more,
		headline:
			more === 0 ? 'Stop: every unit of the plan is counted' : `Keep counting: ${more} to go`,
		detail
	};
}

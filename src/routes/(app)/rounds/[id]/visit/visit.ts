import { assessBlock, summarizeSample, type AssessBlockInput, type UnitCount } from '$lib/engine';
import type { VisitCreateInput } from '$lib/schemas/scouting';
import { plansFor, ruleAt, type PlanKey, type SamplingPlan } from '$lib/scouting/plans';

export interface DraftUnit {
	wingless: number;
	winged: number;
	infested: boolean | null;
}

/** A visit in progress; stored on the phone after every tap. */
export interface Draft {
	key: string;
	step: 'start' | 'count' | 'enemies' | 'review';
	startedAt: string;
	visitedOn: string;
	position: { lat: number; lon: number; source: 'gps' | 'manual' } | null;
	bbch: number | null;
	airTempC: number | null;
	planKey: PlanKey;
	units: DraftUnit[];
	cursor: number;
	enemies: {
		mummies: number;
		ladybeetles: number;
		lacewings: number;
		hoverflies: number;
		otherPredators: number;
	};
	notes: string;
}

export function newDraft(key: string, today: string): Draft {
	return {
		key,
		step: 'start',
		startedAt: new Date().toISOString(),
		visitedOn: today,
		position: null,
		bbch: null,
		airTempC: null,
		planKey: 'count',
		units: [],
		cursor: 0,
		enemies: { mummies: 0, ladybeetles: 0, lacewings: 0, hoverflies: 0, otherPredators: 0 },
		notes: ''
	};
}

export const blankUnit = (): DraftUnit => ({ wingless: 0, winged: 0, infested: null });

/** The plans on offer at the draft's growth stage, and the one chosen. */
export function planOf(
	engine: AssessBlockInput,
	d: Draft
): { plans: SamplingPlan[]; plan: SamplingPlan } {
	const plans = plansFor(engine.pest.code, engine.thresholds, d.bbch);
	return { plans, plan: plans.find((p) => p.key === d.planKey) ?? plans[0] };
}

export const ruleOf = (engine: AssessBlockInput, d: Draft) => ruleAt(engine.thresholds, d.bbch);

const blank = (u: DraftUnit) => u.wingless + u.winged === 0 && u.infested === null;

/**
 * Units the scout has finished: a presence unit once marked; a count unit once the scout moved
 * past it (the last one only if it has taps, since a new unit starts blank).
 */
export function doneUnits(d: Draft, plan: SamplingPlan): UnitCount[] {
	const list = plan.mode === 'count' ? d.units.slice() : d.units.filter((u) => u.infested !== null);
	if (plan.mode === 'count' && list.length && blank(list[list.length - 1])) list.pop();
	return list.map((u) =>
		plan.mode === 'count'
			? { aphids: u.wingless + u.winged, alate: u.winged }
			: { infested: !!u.infested }
	);
}

export const position = (plan: SamplingPlan, i: number) => ({
	stop: Math.floor(i / plan.perStop) + 1,
	unit: (i % plan.perStop) + 1
});

export function payload(
	blockId: number,
	d: Draft,
	plan: SamplingPlan,
	decision: string
): VisitCreateInput {
	const units = doneUnits(d, plan);
	return {
		clientKey: d.key,
		blockId,
		visitedOn: d.visitedOn,
		startedAt: d.startedAt,
		position: d.position,
		bbch: d.bbch,
		airTempC: d.airTempC,
		sampleUnit: plan.sampleUnit,
		mode: plan.mode,
		tallyThreshold: plan.tallyThreshold,
		samplingPlan: plan.key,
		planDecision: decision.slice(0, 200),
		counts: units.map((u, i) => ({ ...position(plan, i), ...u })),
		enemies: d.enemies,
		notes: d.notes.trim() || undefined
	};
}

/** The engine's figures for this visit alone and for the block with it added. */
export function preview(engine: AssessBlockInput, d: Draft, plan: SamplingPlan) {
	const units = doneUnits(d, plan);
	if (!units.length) return null;
	const visit = {
		id: 'new',
		date: d.visitedOn,
		bbch: d.bbch ?? undefined,
		sampleUnit: plan.sampleUnit,
		units,
		mummies: d.enemies.mummies,
		predators: {
			ladybeetle: d.enemies.ladybeetles,
			lacewing: d.enemies.lacewings,
			hoverfly: d.enemies.hoverflies,
			other: d.enemies.otherPredators
		}
	};
	const sample = summarizeSample(visit, { tallyThreshold: plan.tallyThreshold ?? 1 });
	const prior = engine.visits.filter((v) => v.date <= d.visitedOn);
	try {
		const assessment = assessBlock({
			...engine,
			asOf: d.visitedOn > engine.asOf ? d.visitedOn : engine.asOf,
			visits: [...prior, visit]
		});
		return { sample, assessment, error: null };
	} catch (e) {
		return { sample, assessment: null, error: e instanceof Error ? e.message : String(e) };
	}
}

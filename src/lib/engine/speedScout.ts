import { EngineInputError, count } from './errors';
import { sprtDecide, sprtProportion, type StopLines } from './sequential';
import type { Sourced } from './types';

/** A binomial plan checked in batches: start with `start` units, add `step` up to `max`. */
export interface BatchPlan {
	name: string;
	tallyThreshold: Sourced<number>;
	start: Sourced<number>;
	step: Sourced<number>;
	max: Sourced<number>;
	lines: Sourced<StopLines>;
	resampleDays: Sourced<[number, number]>;
	confirmDays: Sourced<[number, number]>;
}

const SPEED = 'Hodgson et al., University of Minnesota / Iowa State extension speed scouting';

/**
 * Soybean aphid speed scouting. The published plan gives the 11-plant row (0-6 infested: no
 * action, 7-10: take more, 11: treat); the printed rows for 16-31 plants were not at hand, so
 * the lines come from a Wald SPRT at the plan's 75 % reliability (alpha = beta = 0.25) with p0
 * 0.72 and p1 0.82, chosen so the 11-plant row matches. Replace with the card when verified.
 */
export const SPEED_SCOUTING_SOYBEAN: BatchPlan = {
	name: 'Soybean aphid speed scouting',
	tallyThreshold: { value: 40, source: SPEED, provenance: 'published' },
	start: { value: 11, source: SPEED, provenance: 'published' },
	step: { value: 5, source: SPEED, provenance: 'published' },
	max: { value: 31, source: SPEED, provenance: 'published' },
	lines: {
		value: sprtProportion(0.72, 0.82, { alpha: 0.25, beta: 0.25 }),
		source: 'fitted to the published 11-plant row; p0, p1 are not from the plan',
		provenance: 'assumption'
	},
	resampleDays: { value: [3, 4], source: SPEED, provenance: 'published' },
	confirmDays: { value: [3, 4], source: SPEED, provenance: 'published' }
};

export interface BatchAnswer {
	decision: 'keep-sampling' | 'act' | 'no-action' | 'resample';
	n: number;
	infested: number;
	unitsStillNeeded: number;
	note: string;
}

/** Where a batch plan stands after n units with `infested` of them at the tally threshold. */
export function batchDecide(plan: BatchPlan, n: number, infested: number): BatchAnswer {
	count(n, 'n');
	count(infested, 'infested');
	if (infested > n) throw new EngineInputError('infested', 'cannot exceed the units examined');
	const start = plan.start.value;
	const step = plan.step.value;
	const max = plan.max.value;
	const [r0, r1] = plan.resampleDays.value;
	if (n < start) {
		return {
			decision: 'keep-sampling',
			n,
			infested,
			unitsStillNeeded: start - n,
			note: `examine ${start} units first`
		};
	}
	// Decisions are read only at the batch sizes the plan prints (11, 16, ... 31).
	const checkpoint = Math.min(max, start + step * Math.floor((n - start) / step));
	if (checkpoint !== n && n < max) {
		const need = checkpoint + step - n;
		return {
			decision: 'keep-sampling',
			n,
			infested,
			unitsStillNeeded: need,
			note: `finish the batch of ${step}`
		};
	}
	const a = sprtDecide(plan.lines.value, n, infested);
	if (a.decision === 'act') {
		const [c0, c1] = plan.confirmDays.value;
		return {
			decision: 'act',
			n,
			infested,
			unitsStillNeeded: 0,
			note: `treat; confirm ${c0}-${c1} days later`
		};
	}
	if (a.decision === 'no-action') {
		return { decision: 'no-action', n, infested, unitsStillNeeded: 0, note: 'no action now' };
	}
	if (n >= max) {
		return {
			decision: 'resample',
			n,
			infested,
			unitsStillNeeded: 0,
			note: `no decision; resample in ${r0}-${r1} days`
		};
	}
	return {
		decision: 'keep-sampling',
		n,
		infested,
		unitsStillNeeded: step,
		note: `examine ${step} more`
	};
}

import { dayNumber } from './dates';
import { EngineInputError, finite, positive } from './errors';
import { summarizeSample, type SampleSummary } from './sample';
import type { AssessBlockInput, VisitInput } from './types';

/** Units per plant for a sample unit: 1 for plants, else the block's, else the unit's default. */
export function unitsPerPlantFor(input: AssessBlockInput, unit: string): number | null {
	if (unit === 'plant') return 1;
	const b = input.block.unitsPerPlant;
	if (b !== undefined) return positive(b, 'block.unitsPerPlant');
	return input.sampleUnits?.find((u) => u.code === unit)?.unitsPerPlantDefault ?? null;
}

/** Checks the date and stage of one visit; returns its day number. */
export function checkVisit(v: VisitInput, i: number): number {
	const day = dayNumber(v?.date, `visits[${i}].date`);
	if (v.bbch !== undefined) finite(v.bbch, `visits[${i}].bbch`);
	return day;
}

export interface PreparedVisits {
	summaries: SampleSummary[];
	days: number[];
}

/** Summaries and day numbers for every visit, in date order and not after asOf. */
export function prepareVisits(
	input: AssessBlockInput,
	asOfDay: number,
	tally: number
): PreparedVisits {
	const summaries: SampleSummary[] = [];
	const days: number[] = [];
	let prev = -Infinity;
	input.visits.forEach((v, i) => {
		const day = checkVisit(v, i);
		if (day < prev) throw new EngineInputError(`visits[${i}].date`, 'visits must be in date order');
		if (day > asOfDay) throw new EngineInputError(`visits[${i}].date`, 'is after asOf');
		prev = day;
		const upp = unitsPerPlantFor(input, v.sampleUnit);
		summaries.push(
			summarizeSample(v, { tallyThreshold: tally, unitsPerPlant: upp, field: `visits[${i}]` })
		);
		days.push(day);
	});
	return { summaries, days };
}

/** The latest visits with the same sample unit as the last one (trend and CAD use these). */
export function sameUnit(p: PreparedVisits): PreparedVisits {
	const last = p.summaries[p.summaries.length - 1];
	const out: PreparedVisits = { summaries: [], days: [] };
	if (!last) return out;
	p.summaries.forEach((s, i) => {
		if (s.sampleUnit !== last.sampleUnit) return;
		out.summaries.push(s);
		out.days.push(p.days[i]);
	});
	return out;
}

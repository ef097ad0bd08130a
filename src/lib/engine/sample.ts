import { count, EngineInputError, positive } from './errors';
import { tQuantile, wilson95 } from './stats';
import type { VisitInput } from './types';

export interface SampleSummary {
	id: string | number | null;
	date: string;
	bbch: number | null;
	sampleUnit: string;
	/** Units examined (counted and presence-absence). */
	n: number;
	/** Units with an aphid count; mean, SD and CI rest on these. */
	counted: number;
	total: number | null;
	mean: number | null;
	sd: number | null;
	se: number | null;
	/** t-distribution 95 % CI of the mean, lower end clamped at 0 (counts cannot be negative). */
	ci95: [number, number] | null;
	df: number | null;
	tallyThreshold: number;
	infested: number;
	proportionInfested: number;
	/** Wilson score 95 % interval. */
	proportionCi95: [number, number];
	alate: number;
	unitsPerPlant: number | null;
	perPlant: { mean: number; ci95: [number, number] | null } | null;
	mummies: number;
	predators: number;
}

export interface SampleOptions {
	tallyThreshold?: number;
	unitsPerPlant?: number | null;
	field?: string;
}

/** Mean, SD, SE, t-based 95 % CI and proportion infested for one visit's units. */
export function summarizeSample(visit: VisitInput, opts: SampleOptions = {}): SampleSummary {
	const f = opts.field ?? 'visit';
	const tally = opts.tallyThreshold ?? 1;
	if (!Number.isInteger(tally) || tally < 1) {
		throw new EngineInputError('tallyThreshold', 'must be a whole number of 1 or more');
	}
	const units = visit.units;
	if (!Array.isArray(units) || units.length === 0) {
		throw new EngineInputError(`${f}.units`, 'at least one sample unit is needed');
	}
	let counted = 0;
	let mean = 0;
	let m2 = 0;
	let total = 0;
	let infested = 0;
	let alate = 0;
	for (let i = 0; i < units.length; i++) {
		const u = units[i];
		const a = u.aphids;
		if (a !== undefined) {
			// Field names are built only on error: this loop runs for every unit of every visit.
			if (!Number.isInteger(a) || a < 0) count(a, `${f}.units[${i}].aphids`);
			counted++;
			total += a;
			// Welford: one pass, no array per visit.
			const delta = a - mean;
			mean += delta / counted;
			m2 += delta * (a - mean);
			if (a >= tally) infested++;
			const w = u.alate;
			if (w !== undefined) {
				if (!Number.isInteger(w) || w < 0) count(w, `${f}.units[${i}].alate`);
				if (w > a) throw new EngineInputError(`${f}.units[${i}].alate`, 'cannot exceed aphids');
				alate += w;
			}
		} else if (typeof u.infested === 'boolean') {
			if (u.infested) infested++;
		} else {
			throw new EngineInputError(`${f}.units[${i}]`, 'needs an aphid count or infested yes/no');
		}
	}
	const n = units.length;
	const upp = opts.unitsPerPlant == null ? null : positive(opts.unitsPerPlant, 'unitsPerPlant');
	let sd: number | null = null;
	let se: number | null = null;
	let ci: [number, number] | null = null;
	if (counted >= 2) {
		sd = Math.sqrt(m2 / (counted - 1));
		se = sd / Math.sqrt(counted);
		const half = tQuantile(0.975, counted - 1) * se;
		ci = [Math.max(0, mean - half), mean + half];
	}
	const mummies = visit.mummies === undefined ? 0 : count(visit.mummies, `${f}.mummies`);
	let predators = 0;
	if (visit.predators) {
		for (const [k, v] of Object.entries(visit.predators)) {
			if (v !== undefined) predators += count(v, `${f}.predators.${k}`);
		}
	}
	const hasMean = counted > 0;
	return {
		id: visit.id ?? null,
		date: visit.date,
		bbch: visit.bbch ?? null,
		sampleUnit: visit.sampleUnit,
		n,
		counted,
		total: hasMean ? total : null,
		mean: hasMean ? mean : null,
		sd,
		se,
		ci95: ci,
		df: counted >= 2 ? counted - 1 : null,
		tallyThreshold: tally,
		infested,
		proportionInfested: infested / n,
		proportionCi95: wilson95(infested, n),
		alate,
		unitsPerPlant: upp,
		perPlant:
			hasMean && upp !== null
				? { mean: mean * upp, ci95: ci ? [ci[0] * upp, ci[1] * upp] : null }
				: null,
		mummies,
		predators
	};
}

/** Proportion of units infested at another tally threshold (counted units only). */
export function proportionAtTally(visit: VisitInput, tally: number): number {
	let k = 0;
	let n = 0;
	for (const u of visit.units) {
		if (u.aphids !== undefined) {
			n++;
			if (u.aphids >= tally) k++;
		} else if (tally <= 1 && u.infested) {
			n++;
			k++;
		} else if (tally <= 1) n++;
	}
	return n === 0 ? 0 : k / n;
}

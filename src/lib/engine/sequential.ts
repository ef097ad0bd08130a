import { EngineInputError, count, openUnit, positive } from './errors';

/** Wald SPRT stop lines on the cumulative tally d after n units: d = slope n -/+ h. */
export interface StopLines {
	kind: 'proportion' | 'poisson' | 'negative-binomial';
	slope: number;
	/** Intercept of the lower (no action) line: d <= slope n - hLower. */
	hLower: number;
	/** Intercept of the upper (action) line: d >= slope n + hUpper. */
	hUpper: number;
	/** Most a single unit can add to d (1 for proportions, unbounded for counts). */
	perUnitMax: number | null;
}

export interface ErrorRates {
	alpha: number;
	beta: number;
}

function check(e: ErrorRates): void {
	openUnit(e.alpha, 'alpha');
	openUnit(e.beta, 'beta');
}

function lines(kind: StopLines['kind'], slope: number, denom: number, e: ErrorRates): StopLines {
	return {
		kind,
		slope,
		hLower: Math.log((1 - e.alpha) / e.beta) / denom,
		hUpper: Math.log((1 - e.beta) / e.alpha) / denom,
		perUnitMax: kind === 'proportion' ? 1 : null
	};
}

/** Stop lines for infested units: p0 (no action) < p1 (action). */
export function sprtProportion(p0: number, p1: number, e: ErrorRates): StopLines {
	openUnit(p0, 'p0');
	openUnit(p1, 'p1');
	if (p1 <= p0) throw new EngineInputError('p1', 'must be above p0');
	check(e);
	const denom = Math.log((p1 * (1 - p0)) / (p0 * (1 - p1)));
	return lines('proportion', Math.log((1 - p0) / (1 - p1)) / denom, denom, e);
}

/** Stop lines for counts with Poisson (random) dispersion: m0 < m1 per unit. */
export function sprtPoisson(m0: number, m1: number, e: ErrorRates): StopLines {
	positive(m0, 'm0');
	positive(m1, 'm1');
	if (m1 <= m0) throw new EngineInputError('m1', 'must be above m0');
	check(e);
	const denom = Math.log(m1 / m0);
	return lines('poisson', (m1 - m0) / denom, denom, e);
}

/** Stop lines for counts with negative-binomial dispersion and a common exponent k. */
export function sprtNegBinomial(m0: number, m1: number, k: number, e: ErrorRates): StopLines {
	positive(m0, 'm0');
	positive(m1, 'm1');
	positive(k, 'k');
	if (m1 <= m0) throw new EngineInputError('m1', 'must be above m0');
	check(e);
	const denom = Math.log((m1 * (k + m0)) / (m0 * (k + m1)));
	return lines('negative-binomial', (k * Math.log((k + m1) / (k + m0))) / denom, denom, e);
}

export type SequentialDecision = 'keep-sampling' | 'act' | 'no-action';

export interface SequentialAnswer {
	decision: SequentialDecision;
	n: number;
	tally: number;
	lower: number;
	upper: number;
	/** Fewest further units that could end sampling (0 once decided). */
	unitsStillNeeded: number;
	/** Further units, all clean, that would reach "no action". */
	unitsToNoAction: number;
}

/** Where n units with cumulative tally d stand against the stop lines. */
export function sprtDecide(l: StopLines, n: number, d: number): SequentialAnswer {
	count(n, 'n');
	count(d, 'tally');
	if (l.perUnitMax !== null && d > n * l.perUnitMax) {
		throw new EngineInputError('tally', 'cannot exceed the units examined');
	}
	const lower = l.slope * n - l.hLower;
	const upper = l.slope * n + l.hUpper;
	const toNo = Math.max(0, Math.ceil((d + l.hLower) / l.slope - 1e-9) - n);
	if (n > 0 && d <= lower) return answer('no-action', n, d, lower, upper, 0, 0);
	if (n > 0 && d >= upper) return answer('act', n, d, lower, upper, 0, toNo);
	// With counts one heavy unit can cross the upper line; with proportions each adds at most 1.
	let toAct = 1;
	if (l.perUnitMax !== null && l.slope < l.perUnitMax) {
		toAct = Math.max(1, Math.ceil((upper - d) / (l.perUnitMax - l.slope) - 1e-9));
	}
	return answer('keep-sampling', n, d, lower, upper, Math.max(1, Math.min(toNo, toAct)), toNo);
}

function answer(
	decision: SequentialDecision,
	n: number,
	tally: number,
	lower: number,
	upper: number,
	unitsStillNeeded: number,
	unitsToNoAction: number
): SequentialAnswer {
	return { decision, n, tally, lower, upper, unitsStillNeeded, unitsToNoAction };
}

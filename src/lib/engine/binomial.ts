import { EngineInputError, finite, openUnit, positive } from './errors';
import { lnGamma } from './stats';

/** Coefficients of the empirical model ln(-ln(1 - P)) = a + b ln(m). */
export interface EmpiricalBinomial {
	a: number;
	b: number;
}

/** Taylor's power law, variance = a m^b. */
export interface TaylorCoefficients {
	a: number;
	b: number;
}

/** Proportion infested expected at mean m under the empirical model. */
export function proportionFromMeanEmpirical(m: number, c: EmpiricalBinomial): number {
	positive(m, 'mean');
	finite(c.a, 'a');
	positive(c.b, 'b');
	return -Math.expm1(-Math.exp(c.a + c.b * Math.log(m)));
}

/** Mean density from the proportion infested under the empirical model (the inverse). */
export function meanFromProportionEmpirical(p: number, c: EmpiricalBinomial): number {
	openUnit(p, 'proportion');
	finite(c.a, 'a');
	positive(c.b, 'b');
	return Math.exp((Math.log(-Math.log1p(-p)) - c.a) / c.b);
}

// Negative-binomial probability of fewer than `tally` aphids on a unit at mean m, with k from
// Taylor's law: k = m / (a m^(b-1) - 1). Where a m^(b-1) <= 1 (no aggregation) use Poisson.
function probBelowTally(m: number, t: TaylorCoefficients, tally: number): number {
	const q = t.a * Math.pow(m, t.b - 1);
	if (q <= 1 + 1e-9) {
		let term = Math.exp(-m);
		let sum = term;
		for (let x = 1; x < tally; x++) {
			term *= m / x;
			sum += term;
		}
		return Math.min(1, sum);
	}
	const k = m / (q - 1);
	// P(0) = (k / (k + m))^k = exp(-m ln q / (q - 1)), the form in Wilson and Room 1983.
	const lnP0 = -k * Math.log(q);
	const ratio = m / (k + m);
	let lnTerm = lnP0;
	let sum = Math.exp(lnP0);
	for (let x = 1; x < tally; x++) {
		lnTerm += Math.log((k + x - 1) / x) + Math.log(ratio);
		sum += Math.exp(lnTerm);
	}
	return Math.min(1, sum);
}

/** Proportion of units with >= tally aphids at mean m, negative binomial with Taylor's law. */
export function proportionFromMeanTaylor(m: number, t: TaylorCoefficients, tally = 1): number {
	positive(m, 'mean');
	positive(t.a, 'a');
	finite(t.b, 'b');
	if (!Number.isInteger(tally) || tally < 1)
		throw new EngineInputError('tally', 'must be 1 or more');
	return 1 - probBelowTally(m, t, tally);
}

/** Mean density that gives proportion p infested (negative binomial, Taylor's law); bisection. */
export function meanFromProportionTaylor(p: number, t: TaylorCoefficients, tally = 1): number {
	openUnit(p, 'proportion');
	let lo = Math.log(1e-6);
	let hi = Math.log(1e6);
	const at = (lm: number) => proportionFromMeanTaylor(Math.exp(lm), t, tally);
	if (at(lo) > p || at(hi) < p) {
		throw new EngineInputError('proportion', 'outside what these coefficients can give');
	}
	for (let i = 0; i < 100; i++) {
		const mid = (lo + hi) / 2;
		if (at(mid) < p) lo = mid;
		else hi = mid;
	}
	return Math.exp((lo + hi) / 2);
}

/** Negative-binomial log probability of x aphids at mean m and exponent k (for tests and SPRT). */
export function lnNegBinomialPmf(x: number, m: number, k: number): number {
	return (
		lnGamma(k + x) -
		lnGamma(k) -
		lnGamma(x + 1) +
		k * Math.log(k / (k + m)) +
		x * Math.log(m / (k + m))
	);
}

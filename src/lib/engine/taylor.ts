import { EngineInputError } from './errors';
import { linearFit } from './stats';
import type { TaylorCoefficients } from './binomial';

export interface TaylorFit extends TaylorCoefficients {
	/** Samples used (mean and variance both above zero). */
	used: number;
	r2: number | null;
	seB: number | null;
}

/** Sample mean and variance of one set of counts. */
export function meanVariance(counts: readonly number[]): { mean: number; variance: number } {
	let mean = 0;
	let m2 = 0;
	for (let i = 0; i < counts.length; i++) {
		const d = counts[i] - mean;
		mean += d / (i + 1);
		m2 += d * (counts[i] - mean);
	}
	return { mean, variance: counts.length > 1 ? m2 / (counts.length - 1) : 0 };
}

/**
 * Fit Taylor's power law (variance = a m^b) by least squares of ln variance on ln mean, from
 * an organisation's own samples (each an array of counts from one block visit).
 */
export function fitTaylor(samples: readonly (readonly number[])[]): TaylorFit {
	const xs: number[] = [];
	const ys: number[] = [];
	samples.forEach((s, i) => {
		if (s.length < 2) return;
		for (let j = 0; j < s.length; j++) {
			if (!Number.isInteger(s[j]) || s[j] < 0) {
				throw new EngineInputError(`samples[${i}][${j}]`, 'must be a whole number of zero or more');
			}
		}
		const { mean, variance } = meanVariance(s);
		// Zero means or variances have no logarithm; they carry no information on the slope.
		if (mean > 0 && variance > 0) {
			xs.push(Math.log(mean));
			ys.push(Math.log(variance));
		}
	});
	const fit = xs.length >= 3 ? linearFit(xs, ys) : null;
	if (!fit) {
		throw new EngineInputError('samples', 'need 3 or more samples with differing non-zero means');
	}
	return {
		a: Math.exp(fit.intercept),
		b: fit.slope,
		used: xs.length,
		r2: fit.r2,
		seB: fit.seSlope
	};
}

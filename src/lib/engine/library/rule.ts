import type { Provenance, ThresholdRule } from '../types';

/** A threshold rule, published unless marked otherwise. */
export const rule = (
	r: Omit<ThresholdRule, 'provenance'> & { provenance?: Provenance }
): ThresholdRule => ({ provenance: 'published', ...r });

/** Where a source names no growth stage. */
export const ANY = { bbchFrom: 0, bbchTo: 99 };

import type { FeedingParams, Provenance, Sourced } from '../types';

/** Shorthand for a sourced default. */
export const v = (value: number, source: string, provenance: Provenance): Sourced<number> => ({
	value,
	source,
	provenance
});

const RHODES = 'Rhodes, Croghan and Dixon 1996, J. Exp. Biol. 199:1269';
const JENSEN =
	'Jensen, Savage and Holbrook 2013, J. R. Soc. Interface 10:20130055: mean 18.2 % w/v over 41 species';

/**
 * Feeding defaults. Ingestion (12.4 nl/mg/h) and excretion (31 % of sucrose) were measured on
 * pea aphid on a 25 % sucrose diet; for other species they are carried over as an assumption.
 * No verified body masses were found, so mass is an assumption to edit per species and morph.
 */
export function feeding(
	bodyMassMg: number,
	massNote: string,
	measuredSpecies: boolean
): FeedingParams {
	const carried = measuredSpecies ? 'published' : 'assumption';
	const how = measuredSpecies
		? RHODES
		: `${RHODES}, measured on pea aphid; carried over to this species`;
	return {
		morph: 'apterous',
		bodyMassMg: v(bodyMassMg, massNote, 'assumption'),
		ingestionNlPerMgH: v(12.4, how, carried),
		sapSugarGPerL: v(182, JENSEN, 'published'),
		excretedSugarFraction: v(0.31, how, carried)
	};
}

export const MASS_PLACEHOLDER =
	'no verified body mass found; 0.2 mg as in the sugar-to-yield worked example, edit';

export const GLUCOSE_REQ = {
	rice: 'Penning de Vries 1975, via Yoshida 1981: rice grain 1.20 g glucose per g',
	peanut: 'Penning de Vries 1975, via Yoshida 1981: peanut seed 2.16 g glucose per g',
	computed: 'computed from seed composition with Penning de Vries et al. conversion costs'
};

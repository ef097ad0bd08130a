// BBCH growth stages (an open, crop-neutral scale): the first digit is the principal stage, the
// second how far into it the crop is. Labels are Cornicle's plain-language wording.
const PRINCIPAL = [
	'Germination or sprouting',
	'Leaf development',
	'Side shoots or tillering',
	'Stem elongation',
	'Booting or harvestable vegetative parts',
	'Flower buds or ear emerging',
	'Flowering',
	'Fruit or seed developing',
	'Ripening',
	'Senescence'
];

function progress(d: number) {
	if (d === 0) return 'start';
	if (d === 9) return 'end';
	if (d === 5) return 'half-way';
	return d < 5 ? 'early' : 'late';
}

/** "65 · Flowering, half-way" for a BBCH code of 0 to 99. */
export function bbchLabel(code: number): string {
	const p = Math.floor(code / 10);
	const d = code % 10;
	return `${String(code).padStart(2, '0')} · ${PRINCIPAL[p]}, ${progress(d)}`;
}

/** Codes offered in the stage picker, grouped by principal stage. */
export const BBCH_GROUPS = PRINCIPAL.map((name, p) => ({
	name,
	codes: [0, 1, 3, 5, 7, 9].map((d) => p * 10 + d)
}));

/**
 * The cautions every recommendation to apply a product carries, in Cornicle's own words, on
 * every screen, message and report that shows one. Plain text so mail, SMS and PDF share it.
 */
export const CAUTIONS = [
	{
		key: 'label',
		title: 'The label is the law',
		text: 'The product label is the legal instruction. Follow it, and local regulations, over anything Cornicle says. This is advice, not a prescription; where a licensed adviser must sign off, get that sign-off first.'
	},
	{
		key: 'intervals',
		title: 'Re-entry and harvest intervals',
		text: 'Nobody enters the treated block until the re-entry interval (REI) has passed; with a tank mix, the longest REI applies. No harvest until the pre-harvest interval (PHI) has passed.'
	},
	{
		key: 'pollinators',
		title: 'Protect pollinators',
		text: 'Do not spray open bloom while bees are foraging. A missing bee warning is not an all-clear. Keep drift away from hives, water and neighbouring crops.'
	},
	{
		key: 'resistance',
		title: 'Slow resistance',
		text: 'Rotate IRAC mode-of-action groups; avoid repeating a group already used on this block this season.'
	},
	{
		key: 'ppe',
		title: 'Protective equipment',
		text: 'Wear the personal protective equipment the label states, for mixing, spraying and re-entry.'
	}
] as const;

/** One short line for SMS, where the full cautions do not fit; it points to them. */
export const CAUTION_SMS =
	'Follow the product label and local rules; observe REI/PHI; protect bees. Details in the link.';

/** The line every other recommendation SMS ends with (re-scout, no action...): it defers to the label. */
export const CAUTION_SMS_SHORT = 'Follow the label and local rules.';

export function cautionsText() {
	return CAUTIONS.map((c) => `${c.title}: ${c.text}`).join('\n');
}

import { z } from 'zod';
import { DECISIONS, PROVENANCE, type Decision } from '$lib/domain';

const ISO = /^\d{4}-\d{2}-\d{2}$/;
const isDate = (v: string) => ISO.test(v) && !Number.isNaN(Date.parse(`${v}T00:00:00Z`));

/** A date field that may be left empty ('' means not given). */
const optionalDate = (what: string) =>
	z
		.string()
		.trim()
		.default('')
		.refine((v) => v === '' || isDate(v), `Write the ${what} as a date (yyyy-mm-dd).`);

/**
 * One recommendation. The decision is required; a treat needs a product and a target date, a
 * re-scout needs its date. Empty decision is allowed by the type only so the form starts blank.
 */
export const recommendationSchema = z
	.object({
		decision: z.union([z.enum(DECISIONS), z.literal('')]).default(''),
		productId: z.number().int().min(0).default(0),
		targetDate: optionalDate('target date'),
		rescoutBy: optionalDate('re-scout date'),
		notes: z.string().trim().max(2000, 'Keep the notes under 2,000 characters.').default(''),
		/** Set when the agronomist has read the warnings the checks raised. */
		confirmWarnings: z.boolean().default(false)
	})
	.superRefine((v, ctx) => {
		const need = (path: string, message: string) =>
			ctx.addIssue({ code: 'custom', path: [path], message });
		if (v.decision === '') need('decision', 'Choose a decision.');
		if (v.decision === 'treat') {
			if (!v.productId) need('productId', 'Choose a product for a treat recommendation.');
			if (!v.targetDate) need('targetDate', 'Give the date the treatment is planned for.');
		}
		if (v.decision === 'rescout' && !v.rescoutBy)
			need('rescoutBy', 'Give the date by which the block is to be scouted again.');
	});
export type RecommendationInput = z.infer<typeof recommendationSchema> & { decision: Decision };

/** The JSON API takes the same fields; the decision is the same required enum. */
export const recommendationApiSchema = z
	.object({
		blockId: z.number({ error: 'blockId must be a number' }).int().positive(),
		decision: z.enum(DECISIONS, { error: `decision must be one of ${DECISIONS.join(', ')}` }),
		productId: z.number().int().positive().optional(),
		targetDate: z.string().refine(isDate, 'targetDate must be a date (yyyy-mm-dd)').optional(),
		rescoutBy: z.string().refine(isDate, 'rescoutBy must be a date (yyyy-mm-dd)').optional(),
		notes: z.string().max(2000).optional(),
		issue: z.boolean().default(false),
		confirmWarnings: z.boolean().default(false)
	})
	.superRefine((v, ctx) => {
		if (v.decision === 'treat' && !v.productId)
			ctx.addIssue({ code: 'custom', path: ['productId'], message: 'a treat needs a productId' });
		if (v.decision === 'treat' && !v.targetDate)
			ctx.addIssue({ code: 'custom', path: ['targetDate'], message: 'a treat needs a targetDate' });
		if (v.decision === 'rescout' && !v.rescoutBy)
			ctx.addIssue({ code: 'custom', path: ['rescoutBy'], message: 'a re-scout needs rescoutBy' });
	});

/** Marks a recommendation as applied: when and by whom. */
export const appliedSchema = z.object({
	id: z.number().int().positive(),
	appliedOn: z
		.string()
		.trim()
		.refine(isDate, 'Write the date it was applied (yyyy-mm-dd).')
		.refine((v) => v <= new Date().toISOString().slice(0, 10), 'That date is in the future.'),
	appliedBy: z
		.string()
		.trim()
		.min(2, 'Say who applied it (a name or contractor).')
		.max(160, 'Keep the name under 160 characters.')
});

/** Acknowledge, issue or withdraw: one id. */
export const idSchema = z.object({ id: z.number().int().positive() });

export const BEE_HAZARDS = ['low', 'moderate', 'high'] as const;

/** A product of the organisation's list; values come from the product label. */
export const productSchema = z.object({
	id: z.number().int().min(0).default(0),
	name: z
		.string()
		.trim()
		.min(2, 'Give the product name as on the label.')
		.max(160, 'At most 160 characters.'),
	activeIngredient: z
		.string()
		.trim()
		.min(2, 'Name the active ingredient(s).')
		.max(200, 'At most 200 characters.'),
	iracGroup: z
		.string()
		.trim()
		.toUpperCase()
		.regex(
			/^(\d{1,2}[A-F]?|UN[A-Z]?)$/,
			'Write the IRAC group as on the label, e.g. 4A, 9D or 29.'
		),
	rate: z
		.number({ error: 'Give the label rate as a number.' })
		.positive('The rate must be above 0.'),
	rateUnit: z
		.string()
		.trim()
		.min(1, 'Give the rate unit, e.g. mL/ha.')
		.max(40, 'At most 40 characters.'),
	reiHours: z
		.number({ error: 'Give the REI in hours.' })
		.int('Whole hours, please.')
		.min(0, 'The REI cannot be negative.')
		.max(720, 'An REI over 30 days (720 h) looks like a typing error.'),
	phiDays: z
		.number({ error: 'Give the PHI in days.' })
		.int('Whole days, please.')
		.min(0, 'The PHI cannot be negative.')
		.max(365, 'A PHI over a year looks like a typing error.'),
	// Starts blank: a pre-filled "low" would be a silent all-clear.
	beeHazard: z
		.union([z.enum(BEE_HAZARDS), z.literal('')])
		.default('')
		.refine((v) => v !== '', 'Choose the bee hazard from the label.'),
	notes: z.string().trim().max(2000, 'Keep the notes under 2,000 characters.').default('')
});

/** An organisation's own threshold rule; the checks mirror the engine's (rules.ts). */
export const thresholdSchema = z
	.object({
		id: z.number().int().min(0).default(0),
		cropId: z.number().int().positive('Choose a crop.'),
		pestId: z.number().int().positive('Choose a pest.'),
		sampleUnitId: z.number().int().positive('Choose the sample unit.'),
		bbchFrom: z
			.number()
			.int('A BBCH code is a whole number.')
			.min(0, 'BBCH runs 0 to 99.')
			.max(99, 'BBCH runs 0 to 99.'),
		bbchTo: z
			.number()
			.int('A BBCH code is a whole number.')
			.min(0, 'BBCH runs 0 to 99.')
			.max(99, 'BBCH runs 0 to 99.'),
		metric: z.enum(['mean', 'proportion'], { error: 'Choose mean per unit or share infested.' }),
		tallyThreshold: z.number().int('A whole number of aphids.').min(1, 'At least 1.').optional(),
		action: z
			.number({ error: 'Give the action threshold.' })
			.positive('The action threshold must be above 0.'),
		injury: z.number().positive('The injury level must be above 0.').optional(),
		requiresRising: z.boolean().default(false),
		alsoProportion: z.number().gt(0, 'Above 0.').max(1, 'A share is at most 1 (100 %).').optional(),
		label: z
			.string()
			.trim()
			.min(3, 'Give the rule a short label.')
			.max(200, 'At most 200 characters.'),
		source: z
			.string()
			.trim()
			.min(3, 'Name the source: a paper, an extension guide, or "common practice".')
			.max(500, 'At most 500 characters.'),
		provenance: z
			.union([z.enum(PROVENANCE), z.literal('')])
			.default('')
			.refine((v) => v !== '', 'Say where the value comes from.')
	})
	.superRefine((v, ctx) => {
		const bad = (path: string, message: string) =>
			ctx.addIssue({ code: 'custom', path: [path], message });
		if (v.bbchTo < v.bbchFrom) bad('bbchTo', 'The last stage must not come before the first.');
		if (v.metric === 'proportion' && v.action > 1)
			bad('action', 'A share infested is at most 1 (write 0.5 for 50 %).');
		if (v.injury !== undefined && v.injury <= v.action)
			bad('injury', 'The injury level must be above the action threshold.');
	});

export const ruleIdSchema = z.object({ id: z.number().int().positive() });

/** The live check of a draft treat (no write). */
export const checkApiSchema = z.object({
	blockId: z.number().int().positive(),
	decision: z.string(),
	productId: z.number().int().positive().optional(),
	targetDate: z.string().refine(isDate, 'targetDate must be a date (yyyy-mm-dd)').optional(),
	exceptId: z.number().int().positive().optional()
});

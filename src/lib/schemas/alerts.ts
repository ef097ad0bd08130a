import { z } from 'zod';
import { ALERT_KINDS } from '$lib/alerts/words';
import { CHANNELS, LEVEL_KEYS, NOTIFICATION_STATUSES } from '$lib/domain';

const list = (values: readonly string[]) => values.join(', ');
const day = (field: string) => z.iso.date(`${field}: use a date as YYYY-MM-DD`).optional();
/** A position in the log: the row's creation time (Unix seconds) and id. */
const cursor = (field: string) =>
	z
		.string()
		.regex(/^\d{1,11}-\d{1,19}$/, `${field}: not a page position this log made`)
		.optional();

/** The alert log's query string; every refusal names the parameter. */
export const alertLogQuerySchema = z
	.object({
		status: z
			.enum(NOTIFICATION_STATUSES, {
				error: `status: use one of ${list(NOTIFICATION_STATUSES)}`
			})
			.optional(),
		channel: z.enum(CHANNELS, { error: `channel: use one of ${list(CHANNELS)}` }).optional(),
		kind: z.enum(ALERT_KINDS, { error: `kind: use one of ${list(ALERT_KINDS)}` }).optional(),
		from: day('from'),
		to: day('to'),
		older: cursor('older'),
		newer: cursor('newer')
	})
	.strict()
	.superRefine((q, ctx) => {
		if (q.from && q.to && q.from > q.to)
			ctx.addIssue({ code: 'custom', path: ['to'], message: 'to: must not be before from' });
		if (q.older && q.newer)
			ctx.addIssue({
				code: 'custom',
				path: ['newer'],
				message: 'newer: give older or newer, not both'
			});
	});
export type AlertLogQuery = z.infer<typeof alertLogQuerySchema>;

const hhmm = z
	.string()
	.regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a time as HH:MM (00:00 to 23:59)')
	.or(z.literal(''));

/** One subscription as the My alerts form sends it (the id is empty for a new one). */
export const subscriptionSchema = z
	.object({
		id: z.coerce.number().int().positive().optional(),
		channel: z.enum(CHANNELS, { error: 'Choose text message or e-mail' }),
		scope: z.string().regex(/^(all|farm:\d{1,10}|block:\d{1,10})$/, 'Choose which farms or blocks'),
		minLevel: z.enum(LEVEL_KEYS, { error: 'Choose the lowest level worth an alert' }),
		quietStart: hhmm.default(''),
		quietEnd: hhmm.default('')
	})
	.superRefine((s, ctx) => {
		if (!!s.quietStart !== !!s.quietEnd)
			ctx.addIssue({
				code: 'custom',
				path: [s.quietStart ? 'quietEnd' : 'quietStart'],
				message: 'Give both the start and the end of quiet hours, or neither'
			});
		else if (s.quietStart && s.quietStart === s.quietEnd)
			ctx.addIssue({
				code: 'custom',
				path: ['quietEnd'],
				message: 'Quiet hours must end at another time than they start'
			});
	});

/** Where the person's alerts go; the phone number is parsed on the server (libphonenumber-js). */
export const contactSchema = z.object({
	email: z
		.string()
		.trim()
		.toLowerCase()
		.pipe(z.email('E-mail address: enter a valid address, like name@example.org').max(254)),
	phone: z.string().trim().max(40, 'Phone number is too long').default(''),
	/** Asked for only when the e-mail address (the sign-in) changes. */
	currentPassword: z.string().max(200, 'Current password: too long').default('')
});

import { z } from 'zod';
import { PLAN_KEYS } from '$lib/scouting/plans';

const whole = (what: string, max = 100_000) =>
	z
		.number({ error: `${what} must be a number` })
		.int(`${what} must be a whole number`)
		.min(0, `${what} cannot be negative`)
		.max(max, `${what} is implausibly large (over ${max})`);

/** A key made on the phone so that a retried request never stores twice. */
export const clientKey = z
	.string()
	.regex(/^[A-Za-z0-9_-]{8,64}$/, 'clientKey must be 8 to 64 letters, digits, - or _');

export const isoDay = z.iso.date('Use a date as YYYY-MM-DD');

export const unitCountSchema = z
	.object({
		stop: z.number().int('stop must be a whole number').min(1, 'stop starts at 1').max(500),
		unit: z.number().int('unit must be a whole number').min(1, 'unit starts at 1').max(100),
		aphids: whole('aphids').optional(),
		alate: whole('alate').optional(),
		infested: z.boolean('infested must be true or false').optional()
	})
	.superRefine((c, ctx) => {
		if (c.alate !== undefined && (c.aphids === undefined || c.alate > c.aphids))
			ctx.addIssue({
				code: 'custom',
				path: ['alate'],
				message: 'winged aphids are part of the aphid count and cannot exceed it'
			});
		if (c.aphids === undefined && c.infested === undefined)
			ctx.addIssue({ code: 'custom', path: ['aphids'], message: 'give aphids or infested' });
	});

export const enemiesSchema = z.object({
	mummies: whole('mummies').default(0),
	ladybeetles: whole('ladybeetles', 10_000).default(0),
	lacewings: whole('lacewings', 10_000).default(0),
	hoverflies: whole('hoverflies', 10_000).default(0),
	otherPredators: whole('otherPredators', 10_000).default(0)
});

export const positionSchema = z.object({
	lat: z.number().min(-90, 'lat must be -90 to 90').max(90, 'lat must be -90 to 90'),
	lon: z.number().min(-180, 'lon must be -180 to 180').max(180, 'lon must be -180 to 180'),
	source: z.enum(['gps', 'manual'])
});

/** The body of POST /api/visits: one scouting visit with its unit counts. */
export const visitCreateSchema = z
	.object({
		clientKey: clientKey.optional(),
		blockId: z.number('blockId must be a number').int().positive(),
		visitedOn: isoDay,
		startedAt: z.iso.datetime({ offset: true }).optional(),
		position: positionSchema.nullable().optional(),
		bbch: z.number().int('bbch must be a whole number').min(0).max(99).nullable().optional(),
		airTempC: z
			.number('airTempC must be a number')
			.min(-40, 'airTempC below -40 °C is not plausible')
			.max(60, 'airTempC above 60 °C is not plausible')
			.nullable()
			.optional(),
		sampleUnit: z.string().min(1).max(40),
		mode: z.enum(['count', 'presence']),
		tallyThreshold: z.number().int().min(1).max(1000).nullable().optional(),
		samplingPlan: z.enum(PLAN_KEYS).optional(),
		planDecision: z.string().max(200).optional(),
		counts: z
			.array(unitCountSchema)
			.min(1, 'at least one sample unit is needed')
			.max(2000, 'at most 2000 units per visit'),
		enemies: enemiesSchema.default({
			mummies: 0,
			ladybeetles: 0,
			lacewings: 0,
			hoverflies: 0,
			otherPredators: 0
		}),
		notes: z.string().max(4000, 'notes are limited to 4000 characters').optional(),
		photoIds: z.array(z.number().int().positive()).max(20).default([])
	})
	.superRefine((v, ctx) => {
		const seen = new Set<string>();
		v.counts.forEach((c, i) => {
			const key = `${c.stop}/${c.unit}`;
			if (seen.has(key))
				ctx.addIssue({
					code: 'custom',
					path: ['counts', i, 'unit'],
					message: `stop ${c.stop} unit ${c.unit} appears twice`
				});
			seen.add(key);
			if (v.mode === 'count' && c.aphids === undefined)
				ctx.addIssue({
					code: 'custom',
					path: ['counts', i, 'aphids'],
					message: 'a count visit needs aphids on every unit'
				});
		});
	});

export type VisitCreate = z.infer<typeof visitCreateSchema>;
export type VisitCreateInput = z.input<typeof visitCreateSchema>;

/** The body of POST /api/trap-readings. */
export const trapReadingSchema = z.object({
	clientKey: clientKey.optional(),
	trapId: z.number('trapId must be a number').int().positive(),
	readOn: isoDay,
	daysOut: z.number().int('daysOut must be a whole number').min(1).max(60),
	alateCounts: z
		.record(z.string().trim().min(1).max(60), whole('winged aphids'))
		.refine((r) => Object.keys(r).length > 0, 'give at least one species group'),
	cardChanged: z.boolean().default(false),
	notes: z.string().max(2000).optional(),
	photoIds: z.array(z.number().int().positive()).max(5).default([])
});
export type TrapReadingCreate = z.infer<typeof trapReadingSchema>;

export const assignmentSchema = z.object({
	blockId: z.coerce.number().int().positive('Choose a block'),
	scoutId: z.coerce.number().int().positive('Choose a scout'),
	intervalDays: z.coerce
		.number('Re-scout interval must be a number')
		.int('Re-scout interval must be a whole number of days')
		.min(1, 'Re-scout at least every 1 day')
		.max(60, 'Re-scout at most every 60 days')
		.default(7)
});

export const weatherDaySchema = z
	.object({
		farmId: z.coerce.number().int().positive('Choose a farm'),
		day: isoDay,
		tminC: z.coerce.number('Minimum must be a number').min(-50).max(50),
		tmaxC: z.coerce.number('Maximum must be a number').min(-50).max(60)
	})
	.refine((w) => w.tmaxC >= w.tminC, {
		path: ['tmaxC'],
		message: 'The maximum cannot be below the minimum'
	});

export const trapSchema = z.object({
	farmId: z.coerce.number().int().positive('Choose a farm'),
	name: z.string().trim().min(1, 'Give the trap a name').max(120),
	kind: z.enum(['yellow-sticky', 'water-pan', 'suction']),
	lat: z.coerce.number().min(-90).max(90),
	lon: z.coerce.number().min(-180).max(180)
});

/** Field-level issues in the shape every JSON endpoint answers with. */
export function issuesOf(error: z.ZodError) {
	return error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}

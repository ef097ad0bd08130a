import { z } from 'zod';

const isoDay = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD.')
	.refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'This is not a calendar date.');

/** "minLon,minLat,maxLon,maxLat" (the GeoJSON bbox order, RFC 7946 section 5). */
export const bboxParam = z.string().transform((s, ctx) => {
	const n = s.split(',').map((x) => Number(x.trim()));
	if (n.length !== 4 || !n.every(Number.isFinite)) {
		ctx.addIssue({ code: 'custom', message: 'Give four numbers: minLon,minLat,maxLon,maxLat.' });
		return z.NEVER;
	}
	const [minLon, minLat, maxLon, maxLat] = n;
	if (minLon < -180 || maxLon > 180 || minLat < -90 || maxLat > 90) {
		ctx.addIssue({
			code: 'custom',
			message: 'Longitudes lie in -180..180 and latitudes in -90..90.'
		});
		return z.NEVER;
	}
	if (minLon > maxLon || minLat > maxLat) {
		ctx.addIssue({ code: 'custom', message: 'The minimum must not exceed the maximum.' });
		return z.NEVER;
	}
	return { minLon, minLat, maxLon, maxLat };
});
export type BBox = z.output<typeof bboxParam>;

const code = z.string().regex(/^[a-z0-9-]{1,60}$/, 'Use a code such as soybean or soybean-aphid.');

/** Query of GET /api/map/blocks. `on`: levels as they stood at the end of that day. */
export const blocksQuery = z.object({
	bbox: bboxParam.optional(),
	crop: code.optional(),
	pest: code.optional(),
	on: isoDay.optional()
});

/** Query of GET /api/map/traps: the latest reading between `from` and `to` (inclusive). */
export const trapsQuery = z
	.object({ bbox: bboxParam.optional(), from: isoDay.optional(), to: isoDay.optional() })
	.refine((q) => !q.from || !q.to || q.from <= q.to, {
		message: 'from must not be after to.',
		path: ['from']
	});

/**
 * Query of GET /api/region/cells: whole weeks from `from` to `to`. The H3 resolution is fixed
 * (no parameter): answers at two resolutions could be subtracted to single out a farm.
 */
export const regionQuery = z
	.object({ from: isoDay.optional(), to: isoDay.optional() })
	.refine((q) => !q.from || !q.to || q.from <= q.to, {
		message: 'from must not be after to.',
		path: ['from']
	});

/** Parses URL search params with a schema; the JSON 400 body names each bad field. */
export function parseQuery<S extends z.ZodType>(schema: S, params: URLSearchParams) {
	const raw = Object.fromEntries([...params.entries()].filter(([, v]) => v !== ''));
	const r = schema.safeParse(raw);
	if (r.success) return { ok: true as const, data: r.data as z.output<S> };
	const issues = r.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
	return {
		ok: false as const,
		body: {
			message: `Invalid ${issues.map((i) => i.path || 'query').join(', ')}: ${issues[0].message}`,
			issues
		}
	};
}

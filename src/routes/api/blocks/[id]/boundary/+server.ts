import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { checkBoundary } from '$lib/geo/validate';
import { blocksQuery, parseQuery } from '$lib/map/params';
import { requireRole } from '$lib/server/guard';
import { blockForBoundary, saveBoundary } from '$lib/server/boundaries';
import { mapScopeOf } from '$lib/server/map-scope';
import { mapBlocks } from '$lib/server/queries/map';
import type { RequestHandler } from './$types';

const idParam = z.coerce.number().int().positive();

function blockId(raw: string) {
	const id = idParam.safeParse(raw);
	if (!id.success) error(404, 'No such block.');
	return id.data;
}

/**
 * The block as a GeoJSON Feature in detail (its centre point when no boundary is drawn yet);
 * the map's card reads the level's reason from here (?on=YYYY-MM-DD: as it stood that day).
 */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'admin', 'agronomist', 'scout', 'grower');
	const id = blockId(event.params.id);
	const q = parseQuery(blocksQuery.pick({ on: true }), event.url.searchParams);
	if (!q.ok) return json(q.body, { status: 400 });
	const fc = JSON.parse(await mapBlocks(mapScopeOf(user), { blockId: id, on: q.data.on }, true));
	if (!fc.features.length) error(404, 'No such block.');
	return json(fc.features[0], { headers: { 'content-type': 'application/geo+json' } });
};

/** Replaces the block's boundary with a GeoJSON Polygon (or a Feature holding one). */
export const PUT: RequestHandler = async (event) => {
	const user = requireRole(event, 'admin', 'agronomist');
	const id = blockId(event.params.id);
	if (!(await blockForBoundary(id, user.organisationId))) error(404, 'No such block.');
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		return json(
			{
				message: 'The body is not JSON.',
				issues: [{ path: 'boundary', message: 'Send GeoJSON.' }]
			},
			{ status: 400 }
		);
	}
	const checked = checkBoundary(body);
	if (!checked.ok)
		return json(
			{ message: checked.message, issues: [{ path: 'boundary', message: checked.message }] },
			{ status: 400 }
		);
	await saveBoundary(id, user.organisationId, user.id, checked);
	const m = checked.measured;
	return json({
		id,
		areaHa: Math.round(m.areaHa * 100) / 100,
		areaAc: Math.round(m.areaAc * 100) / 100,
		centroid: [m.centroidLon, m.centroidLat]
	});
};

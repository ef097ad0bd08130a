import { json } from '@sveltejs/kit';
import { parseQuery, regionQuery } from '$lib/map/params';
import { aggregateRegion, REGION_RESOLUTION } from '$lib/map/region';
import { weeksBetween } from '$lib/map/weeks';
import { requireRole } from '$lib/server/guard';
import { regionRows } from '$lib/server/queries/map';
import type { RequestHandler } from './$types';

/**
 * The regional overview as GeoJSON hexagons: levels and winged-aphid catches per H3 cell and
 * week, across every organisation of the viewer's region. Cells under 3 farms are withheld and
 * no grower, farm or block name, id or outline is in the answer.
 */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'regional');
	const q = parseQuery(regionQuery, event.url.searchParams);
	if (!q.ok) return json(q.body, { status: 400 });
	const w = weeksBetween(q.data);
	if ('message' in w)
		return json(
			{ message: w.message, issues: [{ path: 'from', message: w.message }] },
			{ status: 400 }
		);
	const rows = await regionRows(user.organisationId, w.weeks);
	const overview = aggregateRegion(
		rows,
		w.weeks.map((x) => x.start),
		REGION_RESOLUTION
	);
	return json(overview, {
		headers: { 'content-type': 'application/geo+json', 'cache-control': 'private, no-store' }
	});
};

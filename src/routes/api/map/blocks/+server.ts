import { json } from '@sveltejs/kit';
import { blocksQuery, parseQuery } from '$lib/map/params';
import { requireRole } from '$lib/server/guard';
import { mapScopeOf } from '$lib/server/map-scope';
import { cachedMapBlocks } from '$lib/server/map-cache';
import type { RequestHandler } from './$types';

/** Blocks as GeoJSON for the map: ?bbox=minLon,minLat,maxLon,maxLat&crop=&pest=&on=YYYY-MM-DD. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'admin', 'agronomist', 'scout', 'grower');
	const q = parseQuery(blocksQuery, event.url.searchParams);
	if (!q.ok) return json(q.body, { status: 400 });
	const t0 = performance.now();
	const { body } = await cachedMapBlocks(mapScopeOf(user), q.data);
	return new Response(body, {
		headers: {
			'content-type': 'application/geo+json',
			'cache-control': 'private, no-store',
			// The query's share of the time, for the bench and the browser's network panel.
			'server-timing': `db;dur=${(performance.now() - t0).toFixed(1)}`
		}
	});
};

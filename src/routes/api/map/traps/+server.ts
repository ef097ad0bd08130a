import { json } from '@sveltejs/kit';
import { formatISO, subDays } from 'date-fns';
import { parseQuery, trapsQuery } from '$lib/map/params';
import { requireRole } from '$lib/server/guard';
import { mapScopeOf } from '$lib/server/map-scope';
import { mapTraps } from '$lib/server/queries/map';
import type { RequestHandler } from './$types';

const day = (d: Date) => formatISO(d, { representation: 'date' });

/** Traps as GeoJSON points with their newest reading in ?from..to (default: the last 14 days). */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'admin', 'agronomist', 'scout', 'grower');
	const q = parseQuery(trapsQuery, event.url.searchParams);
	if (!q.ok) return json(q.body, { status: 400 });
	const to = q.data.to ?? day(new Date());
	const from = q.data.from ?? day(subDays(new Date(`${to}T12:00:00Z`), 13));
	const rows = await mapTraps(mapScopeOf(user), { bbox: q.data.bbox, from, to });
	return json(
		{
			type: 'FeatureCollection',
			from,
			to,
			features: rows.map((t) => ({
				type: 'Feature',
				id: t.id,
				geometry: { type: 'Point', coordinates: [t.lon, t.lat] },
				properties: {
					id: t.id,
					name: t.name,
					kind: t.kind,
					farm: t.farm,
					latest: t.readOn
						? {
								readOn: String(t.readOn).slice(0, 10),
								daysOut: t.daysOut,
								alateTotal: t.alateTotal,
								alateCounts:
									typeof t.alateCounts === 'string' ? JSON.parse(t.alateCounts) : t.alateCounts
							}
						: null
				}
			}))
		},
		{ headers: { 'content-type': 'application/geo+json', 'cache-control': 'private, no-store' } }
	);
};

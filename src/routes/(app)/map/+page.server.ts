import { env } from '$env/dynamic/private';
import { requireRole } from '$lib/server/guard';
import { mapScopeOf } from '$lib/server/map-scope';
import { mapExtent, mapFilters } from '$lib/server/queries/map';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'admin', 'agronomist', 'scout', 'grower');
	const scope = mapScopeOf(user);
	const [filters, extent] = await Promise.all([mapFilters(scope), mapExtent(scope)]);
	return {
		filters,
		extent,
		canEdit: user.role === 'admin' || user.role === 'agronomist',
		tileUrl: env.MAP_TILE_URL || null,
		tileAttribution: env.MAP_TILE_ATTRIBUTION || null
	};
};

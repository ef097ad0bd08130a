import { Organisation } from '$lib/server/db';
import { requireRole } from '$lib/server/guard';
import { env } from '$env/dynamic/private';
import type { PageServerLoad } from './$types';

// The page only names the region; the cells come from /api/region/cells, which applies the
// 3-farm floor and leaves out every grower, farm and block name, id and outline.
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'regional');
	const org = await Organisation.findByPk(user.organisationId, { attributes: ['region'] });
	return {
		region: org?.region ?? 'Your region',
		tileUrl: env.MAP_TILE_URL || null,
		tileAttribution: env.MAP_TILE_ATTRIBUTION || null
	};
};

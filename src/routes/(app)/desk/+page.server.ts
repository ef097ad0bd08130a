import { requireRole } from '$lib/server/guard';
import { blocksOfOrganisation } from '$lib/server/queries/blocks';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	return { blocks: await blocksOfOrganisation(user.organisationId) };
};

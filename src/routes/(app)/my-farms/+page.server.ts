import { requireRole } from '$lib/server/guard';
import { blocksOfGrower } from '$lib/server/queries/blocks';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'grower');
	return { blocks: await blocksOfGrower(user.id, user.organisationId) };
};

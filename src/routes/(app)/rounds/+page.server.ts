import { requireRole } from '$lib/server/guard';
import { blocksOfScout } from '$lib/server/queries/blocks';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'scout');
	return { blocks: await blocksOfScout(user.id, user.organisationId) };
};

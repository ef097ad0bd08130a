import { requireRole } from '$lib/server/guard';
import { blocksOfGrower } from '$lib/server/queries/blocks';
import { recommendationsOfGrower } from '$lib/server/advice/list';
import { recommendationActions } from '$lib/server/advice/actions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'grower');
	const [blocks, recs] = await Promise.all([
		blocksOfGrower(user.id, user.organisationId),
		recommendationsOfGrower(user)
	]);
	const isOpen = (s: string) => s === 'issued' || s === 'acknowledged';
	return {
		blocks,
		open: recs.filter((r) => isOpen(r.status)),
		history: recs.filter((r) => !isOpen(r.status)),
		today: new Date().toISOString().slice(0, 10)
	};
};

export const actions: Actions = {
	acknowledge: recommendationActions.acknowledge,
	applied: recommendationActions.applied
};

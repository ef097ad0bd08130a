import { requireRole } from '$lib/server/guard';
import { blockFor } from '$lib/server/advice/scope';
import { blockView } from '$lib/server/advice/blockView';
import { recommendationsOfBlock } from '$lib/server/advice/list';
import { recommendationActions } from '$lib/server/advice/actions';
import type { Actions, PageServerLoad } from './$types';

const today = () => new Date().toISOString().slice(0, 10);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin', 'grower');
	const block = await blockFor(user, event.params.id);
	const [view, recommendations] = await Promise.all([
		blockView(block, today()),
		recommendationsOfBlock(block.id)
	]);
	return {
		...view,
		recommendations:
			user.role === 'grower'
				? recommendations.filter((r) => r.status !== 'draft')
				: recommendations,
		staff: user.role !== 'grower',
		today: today()
	};
};

export const actions: Actions = recommendationActions;

import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { blockFor } from '$lib/server/advice/scope';
import { blockView } from '$lib/server/advice/blockView';
import { recommendationsOfBlock } from '$lib/server/advice/list';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin', 'grower');
	const block = await blockFor(user, event.params.id);
	const today = new Date().toISOString().slice(0, 10);
	const [view, all] = await Promise.all([
		blockView(block, today),
		recommendationsOfBlock(block.id)
	]);
	const visible = user.role === 'grower' ? all.filter((r) => r.status !== 'draft') : all;
	const recParam = event.url.searchParams.get('rec');
	let recommendations = visible.filter((r) => r.status !== 'withdrawn').slice(0, 5);
	if (recParam) {
		recommendations = visible.filter((r) => String(r.id) === recParam);
		if (!recommendations.length) error(404, 'No such recommendation.');
	}
	return {
		block: view.block,
		assessment: view.assessment,
		degreeDays: view.degreeDays,
		visits: view.visits.slice(0, 8),
		recommendations,
		preparedBy: user.name,
		today
	};
};

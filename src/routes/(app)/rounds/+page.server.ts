import { requireRole } from '$lib/server/guard';
import { scoutsDay } from '$lib/server/scouting/rounds';
import { trapsFor } from '$lib/server/scouting/traps';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'scout');
	const [blocks, traps] = await Promise.all([scoutsDay(user), trapsFor(user)]);
	return {
		blocks,
		traps: traps
			.filter((t) => t.active)
			.map((t) => ({
				id: t.id,
				name: t.name,
				farmName: t.farmName,
				lastReadOn: t.lastReadOn ? String(t.lastReadOn).slice(0, 10) : null
			}))
	};
};

import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { engineInput } from '$lib/server/assessments';
import { blockFor } from '$lib/server/scouting/access';
import { SampleUnit } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin');
	const id = Number(event.params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such block.');
	const access = await blockFor(user, id, 'write');
	if (!access.ok) error(access.status, access.message);
	const b = access.value;
	const today = new Date().toISOString().slice(0, 10);
	const [{ input }, units] = await Promise.all([
		engineInput(id, today),
		SampleUnit.findAll({ attributes: ['code', 'name'] })
	]);
	return {
		block: {
			id: b.id,
			name: b.name,
			farmName: b.farm.name,
			boundary: b.boundary ?? null,
			centroid: { lat: b.centroidLat, lon: b.centroidLon },
			level: b.currentLevel ?? null,
			reason: b.currentReason ?? null,
			lastVisitOn: b.lastVisitOn ?? null
		},
		// Everything the engine needs, so the phone can show the same figures before saving.
		engine: input,
		unitNames: Object.fromEntries(units.map((u) => [u.code, u.name])),
		today
	};
};

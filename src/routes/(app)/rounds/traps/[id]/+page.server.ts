import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { trapFor } from '$lib/server/scouting/access';
import { readingsOf } from '$lib/server/scouting/traps';
import { Farm } from '$lib/server/db';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin');
	const id = Number(event.params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such trap.');
	const access = await trapFor(user, id);
	if (!access.ok) error(access.status, access.message);
	const t = access.value;
	const [farm, readings] = await Promise.all([
		Farm.findByPk(t.farmId, { attributes: ['name'] }),
		readingsOf(id, 6)
	]);
	const groups = [...new Set(readings.flatMap((r) => Object.keys(r.alateCounts)))];
	return {
		trap: { id: t.id, name: t.name, kind: t.kind, farmName: farm?.name ?? '' },
		readings,
		groups: groups.length ? groups : ['soybean aphid', 'other aphids'],
		today: new Date().toISOString().slice(0, 10)
	};
};

import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { visitFor } from '$lib/server/scouting/visits';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin', 'grower');
	const id = Number(event.params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such visit.');
	const r = await visitFor(user, id);
	if (!r.ok) return json({ message: r.message }, { status: r.status });
	return json({ visit: r.value });
};

import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/guard';
import { blockFor } from '$lib/server/scouting/access';
import { invalid } from '$lib/server/scouting/http';
import { visitsOfBlock } from '$lib/server/scouting/visits';
import { isoDay } from '$lib/schemas/scouting';
import type { RequestHandler } from './$types';

const query = z.object({
	since: isoDay.optional(),
	limit: z.coerce.number().int().min(1).max(500).default(100)
});

/** A block's visits, newest first. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin', 'grower');
	const id = Number(event.params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such block.');
	const q = query.safeParse(Object.fromEntries(event.url.searchParams));
	if (!q.success) return invalid(q.error, 'query');
	const access = await blockFor(user, id, 'read');
	if (!access.ok) return json({ message: access.message }, { status: access.status });
	return json({ blockId: id, visits: await visitsOfBlock(id, q.data) });
};

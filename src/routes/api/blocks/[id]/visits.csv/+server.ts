import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { blockFor } from '$lib/server/scouting/access';
import { visitsCsv } from '$lib/server/scouting/csv';
import type { RequestHandler } from './$types';

/** A block's visits as a spreadsheet, one row per sample unit. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin', 'grower');
	const id = Number(event.params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such block.');
	const access = await blockFor(user, id, 'read');
	if (!access.ok) error(access.status, access.message);
	const name = access.value.name.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase();
	return new Response(await visitsCsv(id), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="visits-${name}.csv"`
		}
	});
};

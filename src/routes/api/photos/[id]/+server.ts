import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { readPhoto } from '$lib/server/scouting/photos';
import type { RequestHandler } from './$types';

/** A photo's bytes (or `?size=thumb`), only to users who may see its block or trap. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin', 'grower');
	const id = Number(event.params.id);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such photo.');
	const p = await readPhoto(user, id, event.url.searchParams.get('size') === 'thumb');
	if (!p) error(404, 'No such photo.');
	return new Response(new Uint8Array(p.bytes), {
		headers: {
			'content-type': p.mime,
			'cache-control': 'private, max-age=86400',
			'x-content-type-options': 'nosniff'
		}
	});
};

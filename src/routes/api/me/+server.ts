import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import type { RequestHandler } from './$types';

/** Who the caller is, as the server sees it. */
export const GET: RequestHandler = (event) => {
	const user = requireRole(event);
	return json(user);
};

import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { acknowledge } from '$lib/server/advice/recommendations';
import type { RequestHandler } from './$types';

/** The grower confirms an issued recommendation (own farms only; others answer 404). */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'grower');
	const res = await acknowledge(user, Number(event.params.id));
	if (!res.ok) return json({ message: res.message, issues: [] }, { status: 409 });
	return json({ id: Number(event.params.id), status: 'acknowledged' });
};

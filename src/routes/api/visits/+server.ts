import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { visitCreateSchema } from '$lib/schemas/scouting';
import { fileVisit } from '$lib/server/scouting/visit-batch';
import { invalid, readJson, badRequest } from '$lib/server/scouting/http';
import type { RequestHandler } from './$types';

/**
 * Files a visit with its counts; idempotent by clientKey (a replay answers 200, not 201). Visits
 * arriving together are written in one batch (src/lib/server/scouting/visit-batch.ts).
 */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin');
	const body = await readJson(event.request);
	if (body === null) return badRequest('The body must be JSON.');
	const parsed = visitCreateSchema.safeParse(body);
	if (!parsed.success) return invalid(parsed.error, 'visit');
	const channel = event.request.headers.get('x-cornicle-channel') === 'phone' ? 'phone' : 'api';
	const r = await fileVisit(user, parsed.data, channel);
	if (!r.ok) return json({ message: r.message, issues: r.issues ?? [] }, { status: r.status });
	return json(
		{ created: r.created, visit: r.visit, assessment: r.assessment },
		{
			status: r.created ? 201 : 200,
			headers: { location: `/api/visits/${r.visit.id}` }
		}
	);
};

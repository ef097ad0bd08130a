import { json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { trapReadingSchema } from '$lib/schemas/scouting';
import { badRequest, invalid, readJson } from '$lib/server/scouting/http';
import { createTrapReading } from '$lib/server/scouting/traps';
import type { RequestHandler } from './$types';

/** Stores a sticky-trap reading; idempotent by clientKey. */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin');
	const body = await readJson(event.request);
	if (body === null) return badRequest('The body must be JSON.');
	const parsed = trapReadingSchema.safeParse(body);
	if (!parsed.success) return invalid(parsed.error, 'trap reading');
	const r = await createTrapReading(user, parsed.data);
	if (!r.ok)
		return json(
			{ message: r.message, issues: r.path ? [{ path: r.path, message: r.message }] : [] },
			{ status: r.status }
		);
	return json({ created: r.created, reading: r.reading }, { status: r.created ? 201 : 200 });
};

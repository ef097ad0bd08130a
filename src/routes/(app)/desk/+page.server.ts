import { requireRole } from '$lib/server/guard';
import { readFilter, triage } from '$lib/server/advice/triage';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const filter = readFilter(event.url);
	const today = new Date().toISOString().slice(0, 10);
	return { ...(await triage(user.organisationId, filter, today)), filter, today };
};

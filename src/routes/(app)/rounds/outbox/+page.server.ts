import { requireRole } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

// The outbox lives in the phone's IndexedDB; the server only checks who may open the page.
export const load: PageServerLoad = (event) => {
	requireRole(event, 'scout', 'agronomist', 'admin');
	return {};
};

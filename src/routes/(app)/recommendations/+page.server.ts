import { RECOMMENDATION_STATUSES } from '$lib/domain';
import { requireRole } from '$lib/server/guard';
import { recommendationsOfOrganisation } from '$lib/server/advice/list';
import { recommendationActions } from '$lib/server/advice/actions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const s = event.url.searchParams.get('status');
	const status = s && (RECOMMENDATION_STATUSES as readonly string[]).includes(s) ? s : null;
	return {
		recommendations: await recommendationsOfOrganisation(user.organisationId, status),
		status,
		today: new Date().toISOString().slice(0, 10)
	};
};

export const actions: Actions = {
	issue: recommendationActions.issue,
	withdraw: recommendationActions.withdraw,
	applied: recommendationActions.applied
};

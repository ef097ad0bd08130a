import { redirect } from '@sveltejs/kit';
import { HOME_BY_ROLE } from '$lib/roles';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (locals.user) redirect(303, HOME_BY_ROLE[locals.user.role]);
	return {};
};

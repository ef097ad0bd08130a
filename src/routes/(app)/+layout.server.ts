import { requireRole } from '$lib/server/guard';
import { navFor } from '$lib/nav';
import type { LayoutServerLoad } from './$types';

// The layout only shapes the navigation; each page's own load checks the role again.
export const load: LayoutServerLoad = (event) => {
	const user = requireRole(event);
	return { user, nav: navFor(user.role) };
};

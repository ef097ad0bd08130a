import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '$lib/roles';

/**
 * The signed-in user if their role is one of `roles`; otherwise 401 (anonymous API call),
 * a redirect to sign-in (anonymous page) or 403. Every load, action and endpoint calls this.
 */
export function requireRole(event: Pick<RequestEvent, 'locals' | 'url'>, ...roles: Role[]) {
	const user = event.locals.user;
	if (!user) {
		if (event.url.pathname.startsWith('/api/')) error(401, 'Sign in to use this endpoint.');
		redirect(
			303,
			`/signin?redirectTo=${encodeURIComponent(event.url.pathname + event.url.search)}`
		);
	}
	if (roles.length && !roles.includes(user.role)) {
		error(403, {
			message: `This page is for ${roles.join(' or ')} accounts; you are signed in as ${user.role}.`,
			code: 'forbidden'
		});
	}
	return user;
}

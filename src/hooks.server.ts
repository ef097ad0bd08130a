import { redirect, type Handle, type HandleServerError, type ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { building } from '$app/environment';
import { handle as authHandle } from '$lib/server/auth';
import { assertSafeForProduction } from '$lib/server/config';
import { formGuard } from '$lib/server/form-guard';
import { isPublicPath } from '$lib/server/public-paths';
import {
	databaseOutage,
	isDatabaseUnavailable,
	markDatabaseDown,
	securityHeaders
} from '$lib/server/resilience';
import { ROLES, type Role } from '$lib/roles';
import { env } from '$env/dynamic/private';
import { env as publicEnv } from '$env/dynamic/public';
import { startAlertsInApp, stopAlertsInApp } from '$lib/server/alerts/inApp';
import { originCheck } from '$lib/server/csrf';
import { SessionCache, sessionCookieValue } from '$lib/server/session-cache';
import { closeDatabases, db } from '$lib/server/db';

if (!building) assertSafeForProduction();

const sessions = new SessionCache<SessionUser>();

function sessionUser(u: Partial<SessionUser> | undefined): SessionUser | null {
	return u?.id && u.role && ROLES.includes(u.role as Role) && u.organisationId
		? {
				id: Number(u.id),
				email: u.email ?? '',
				name: u.name ?? '',
				role: u.role as Role,
				organisationId: Number(u.organisationId)
			}
		: null;
}

const loadUser: Handle = async ({ event, resolve }) => {
	const token = sessionCookieValue(event.cookies);
	const kept = token === null ? undefined : sessions.get(token);
	if (kept) {
		event.locals.user = kept;
		return resolve(event);
	}
	const session = await event.locals.auth();
	event.locals.user = sessionUser(session?.user as Partial<SessionUser> | undefined);
	if (token !== null && event.locals.user && session?.expires) {
		sessions.set(token, event.locals.user, Date.parse(session.expires));
	}
	return resolve(event);
};

// A first line of defence: nothing outside the public paths is served to an anonymous caller.
// Each load, action and endpoint still checks the role itself (requireRole).
const guard: Handle = async ({ event, resolve }) => {
	const path = event.url.pathname;
	if (!event.locals.user && !isPublicPath(path)) {
		if (path.startsWith('/api/')) {
			return new Response(JSON.stringify({ message: 'Sign in to use this endpoint.' }), {
				status: 401,
				headers: { 'content-type': 'application/json' }
			});
		}
		redirect(303, `/signin?redirectTo=${encodeURIComponent(path + event.url.search)}`);
	}
	return resolve(event);
};

export const handle = sequence(
	originCheck,
	securityHeaders,
	databaseOutage,
	authHandle,
	loadUser,
	guard,
	formGuard
);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	if (isDatabaseUnavailable(error)) {
		markDatabaseDown(event);
		return {
			message: 'The database is unavailable right now; nothing was saved. Try again shortly.'
		};
	}
	if (status >= 500) console.error(error);
	return {
		message: status >= 500 ? 'Something went wrong on our side. Try again in a moment.' : message
	};
};

// The alerts outbox worker runs inside the app unless ALERTS_WORKER=off (tests that run their
// own workers); more can run beside it (src/lib/server/alerts/cli.ts).
export const init: ServerInit = () => {
	// PUBLIC_BASE_URL is a public variable, so SvelteKit keeps it out of the private env.
	if (building) return;
	startAlertsInApp({ ...env, ...publicEnv }, db);
	// adapter-node stops taking requests on SIGTERM or SIGINT, lets open ones finish and then
	// emits this; the worker finishes its send and the pools close, so the process exits.
	process.once('sveltekit:shutdown', async () => {
		await stopAlertsInApp();
		await closeDatabases();
	});
};

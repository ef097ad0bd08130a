import type { Handle, RequestEvent } from '@sveltejs/kit';
import {
	ConnectionError,
	ConnectionRefusedError,
	ConnectionTimedOutError,
	TimeoutError
} from 'sequelize';

const DB_DOWN = Symbol('db-down');

/** True when an error means the database could not be reached (not a bad query). */
export function isDatabaseUnavailable(error: unknown): boolean {
	if (
		error instanceof ConnectionError ||
		error instanceof ConnectionRefusedError ||
		error instanceof ConnectionTimedOutError ||
		error instanceof TimeoutError
	) {
		return true;
	}
	const code =
		(error as { parent?: { code?: string }; code?: string })?.parent?.code ??
		(error as { code?: string })?.code;
	return [
		'ECONNREFUSED',
		'ER_GET_CONNECTION_TIMEOUT',
		'ER_CONNECTION_TIMEOUT',
		'ER_SOCKET_UNEXPECTED_CLOSE',
		'ECONNRESET',
		'PROTOCOL_CONNECTION_LOST'
	].includes(code ?? '');
}

/** Called from handleError: remembers that this request failed because MariaDB is away. */
export function markDatabaseDown(event: RequestEvent) {
	(event.locals as unknown as Record<symbol, boolean>)[DB_DOWN] = true;
}

const RETRY_AFTER_S = '5';

/**
 * Turns a 500 caused by an unreachable database into a 503 with Retry-After, so clients (and
 * the phone's sync queue) know to try again; the pool reconnects by itself when it is back.
 */
export const databaseOutage: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (response.status === 500 && (event.locals as unknown as Record<symbol, boolean>)[DB_DOWN]) {
		const headers = new Headers(response.headers);
		headers.set('retry-after', RETRY_AFTER_S);
		if (event.url.pathname.startsWith('/api/')) {
			headers.set('content-type', 'application/json');
			return new Response(
				JSON.stringify({
					message: 'The database is unavailable; nothing was saved. Try again shortly.'
				}),
				{ status: 503, headers }
			);
		}
		return new Response(response.body, { status: 503, headers });
	}
	return response;
};

/** Headers every response carries (the content security policy comes from svelte.config.js). */
export const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const h = response.headers;
	const set = (k: string, v: string) => {
		try {
			if (!h.has(k)) h.set(k, v);
		} catch {
			// Some responses (e.g. fetched passthroughs) have immutable headers.
		}
	};
	set('x-content-type-options', 'nosniff');
	set('referrer-policy', 'strict-origin-when-cross-origin');
	set('x-frame-options', 'DENY');
	set('cross-origin-opener-policy', 'same-origin');
	set('permissions-policy', 'geolocation=(self), camera=(self), microphone=()');
	return response;
};

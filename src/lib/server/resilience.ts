import type { Handle, RequestEvent } from '@sveltejs/kit';
import { databaseFailed } from './db';

export { isDatabaseUnavailable } from './db/availability';

const DB_DOWN = Symbol('db-down');

/**
 * Called from handleError: remembers that this request failed because MariaDB is away, and has
 * the database checked in the background (further requests then fail fast until it answers).
 */
export function markDatabaseDown(event: RequestEvent) {
	(event.locals as unknown as Record<symbol, boolean>)[DB_DOWN] = true;
	databaseFailed(undefined);
}

const RETRY_AFTER_S = '5';
const PAGE_REFRESH_S = 10;
const API_MESSAGE = 'The database is unavailable; nothing was saved. Try again shortly.';

/** A page of its own (no layout, no database, no script) for a browser while MariaDB is away. */
export const OUTAGE_PAGE = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="refresh" content="${PAGE_REFRESH_S}">
<title>Back in a moment · Cornicle</title>
<style>
body{margin:0;font:16px/1.5 system-ui,sans-serif;background:#f8f6f3;color:#2a211b}
main{max-width:32rem;margin:0 auto;padding:15vh 1.25rem 2rem}
.mark{font-weight:700;color:#245a3f;letter-spacing:.02em}
.tag{font-size:.8rem;font-weight:600;text-transform:uppercase;letter-spacing:.05em;color:#934a15}
h1{font-size:1.6rem;line-height:1.2;margin:.25rem 0 1rem}
a{display:inline-block;margin-top:1rem;padding:.6rem 1.1rem;border-radius:.4rem;background:#2c704d;color:#fff;text-decoration:none;font-weight:600}
</style>
</head>
<body>
<main>
<p class="mark">Cornicle</p>
<p class="tag">Error 503 · database unavailable</p>
<h1>Cornicle cannot reach its database right now</h1>
<p>Nothing was saved from this request. The service reconnects by itself as soon as the database answers again, usually within seconds.</p>
<p>Counts on a phone stay in its queue and are sent again later. This page tries again in ${PAGE_REFRESH_S} seconds.</p>
<a href="">Try again now</a>
</main>
</body>
</html>
`;

/**
 * Turns a 500 caused by an unreachable database into a 503 with Retry-After, so clients (and
 * the phone's sync queue) know to try again: JSON under /api/, SvelteKit's own JSON for data
 * and form-action requests, and a plain page of its own for a browser. The 500's headers are
 * kept except its length and type (the body is new), or the client would wait for bytes that
 * never come.
 */
export const databaseOutage: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (response.status !== 500 || !(event.locals as unknown as Record<symbol, boolean>)[DB_DOWN]) {
		return response;
	}
	const headers = new Headers(response.headers);
	headers.set('retry-after', RETRY_AFTER_S);
	headers.set('cache-control', 'no-store');
	const type = headers.get('content-type') ?? '';
	if (event.url.pathname.startsWith('/api/')) {
		await response.body?.cancel();
		headers.delete('content-length');
		headers.set('content-type', 'application/json');
		return new Response(JSON.stringify({ message: API_MESSAGE }), { status: 503, headers });
	}
	if (type.startsWith('application/json')) {
		// __data.json and enhanced form actions: SvelteKit's client reads its own error shape.
		return new Response(response.body, { status: 503, headers });
	}
	await response.body?.cancel();
	headers.delete('content-length');
	headers.delete('content-security-policy');
	headers.set('content-type', 'text/html; charset=utf-8');
	headers.set(
		'content-security-policy',
		"default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'; form-action 'self'; base-uri 'none'"
	);
	return new Response(OUTAGE_PAGE, { status: 503, headers });
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

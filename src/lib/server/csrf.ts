import type { Handle } from '@sveltejs/kit';

const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];
const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
/** Providers post signed forms here with no Origin header; each endpoint checks the signature. */
const SIGNED_WEBHOOKS = '/api/webhooks/';

/**
 * SvelteKit's own cross-site form check (turned off in svelte.config.js with
 * `trustedOrigins: ['*']`, since it has no per-route exemption), kept for every path except
 * the signed provider webhooks.
 */
export const originCheck: Handle = ({ event, resolve }) => {
	const { request, url } = event;
	const type = request.headers.get('content-type')?.split(';')[0].trim().toLowerCase() ?? '';
	if (
		UNSAFE.has(request.method) &&
		FORM_TYPES.includes(type) &&
		request.headers.get('origin') !== url.origin &&
		!url.pathname.startsWith(SIGNED_WEBHOOKS)
	) {
		const message = `Cross-site ${request.method} form submissions are forbidden`;
		return request.headers.get('accept') === 'application/json'
			? Response.json({ message }, { status: 403 })
			: new Response(message, { status: 403 });
	}
	return resolve(event);
};

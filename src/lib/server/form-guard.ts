import type { Handle } from '@sveltejs/kit';

const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data'];

/**
 * Form actions read their body as form data; a body that is not one (wrong content type,
 * broken multipart) is answered 400 here, naming the problem, instead of failing inside an
 * action. JSON endpoints under /api/ and Auth.js under /auth/ parse their own bodies.
 */
export const formGuard: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	if (
		request.method !== 'POST' ||
		url.pathname.startsWith('/api/') ||
		url.pathname.startsWith('/auth/')
	) {
		return resolve(event);
	}
	const type = (request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();
	const problem = !FORM_TYPES.includes(type)
		? `A form must be sent as ${FORM_TYPES.join(' or ')}, not ${type || 'no content type'}.`
		: await request
				.clone()
				.formData()
				.then(
					() => null,
					() => 'The form data could not be read (the body is malformed).'
				);
	if (!problem) return resolve(event);
	const wantsJson =
		request.headers.get('x-sveltekit-action') === 'true' ||
		(request.headers.get('accept') ?? '').includes('application/json');
	return wantsJson
		? new Response(JSON.stringify({ type: 'error', error: { message: problem } }), {
				status: 400,
				headers: { 'content-type': 'application/json' }
			})
		: new Response(problem, {
				status: 400,
				headers: { 'content-type': 'text/plain; charset=utf-8' }
			});
};

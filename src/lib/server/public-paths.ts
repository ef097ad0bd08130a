/** Paths an anonymous visitor may request; everything else needs a signed-in user. */
const PUBLIC_PREFIXES = ['/signin', '/auth/', '/api/health', '/api/webhooks/', '/_app/', '/fonts/'];
const PUBLIC_EXACT = new Set([
	'/',
	'/favicon.svg',
	'/robots.txt',
	'/manifest.webmanifest',
	'/service-worker.js',
	'/offline',
	'/api/openapi.json'
]);

export function isPublicPath(path: string) {
	return PUBLIC_EXACT.has(path) || PUBLIC_PREFIXES.some((p) => path.startsWith(p));
}

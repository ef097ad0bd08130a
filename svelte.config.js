import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

// A test slot gets its own build folders so parallel runs never overwrite each other.
const slot = process.env.CORNICLE_SLOT;

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: slot ? `build-${slot}` : 'build' }),
		outDir: slot ? `.svelte-kit-${slot}` : '.svelte-kit',
		// The offline worker is registered by the scout's pages only (scope /rounds), so it never
		// runs for other screens; see src/routes/(app)/rounds/+layout.svelte.
		serviceWorker: { register: false },
		// The cross-site form check runs in hooks (src/lib/server/csrf.ts) so the SMS provider's
		// signed webhooks, which come with no Origin header, can be exempted.
		csrf: { trustedOrigins: ['*'] },
		// Scripts only from the app itself (Kit adds nonces or hashes for its own inline code).
		// Styles allow inline because Leaflet positions tiles and markers with style attributes;
		// images allow https: so a deployment can configure a map tile server.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:', 'https:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'worker-src': ['self'],
				'manifest-src': ['self'],
				'frame-ancestors': ['none'],
				'form-action': ['self'],
				'base-uri': ['self'],
				'object-src': ['none']
			}
		}
	}
};

export default config;

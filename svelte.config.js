import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

// A test slot gets its own build folders so parallel runs never overwrite each other.
const slot = process.env.CORNICLE_SLOT;

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: slot ? `build-${slot}` : 'build' }),
		outDir: slot ? `.svelte-kit-${slot}` : '.svelte-kit'
	}
};

export default config;

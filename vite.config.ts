import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [sveltekit()],
	server: { port: 5173, strictPort: false },
	// The 2-core machines here make SvelteKit's post-build hooks look slow; the report is noise.
	build: { rolldownOptions: { checks: { bundlerTimings: false, circularDependency: false } } },
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					environment: 'node',
					include: ['src/**/*.spec.ts', 'mocks/**/*.spec.ts'],
					exclude: ['src/**/*.db.spec.ts']
				}
			},
			{
				extends: true,
				test: {
					name: 'db',
					environment: 'node',
					include: ['src/**/*.db.spec.ts', 'tests/db/**/*.spec.ts'],
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			},
			{
				extends: true,
				test: {
					name: 'e2e',
					environment: 'node',
					include: ['tests/e2e/**/*.spec.ts', 'tests/http/**/*.spec.ts'],
					fileParallelism: false,
					testTimeout: 60_000,
					hookTimeout: 60_000
				}
			},
			{
				// Fuzzing, the access matrix and fault tests count rows and stop servers, so they run
				// after every other project has finished, one file at a time.
				extends: true,
				test: {
					name: 'hardening',
					environment: 'node',
					include: ['tests/hardening/**/*.spec.ts'],
					fileParallelism: false,
					testTimeout: 300_000,
					hookTimeout: 120_000,
					sequence: { groupOrder: 1 }
				}
			}
		]
	}
});

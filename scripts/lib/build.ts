import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { runCommand } from './procs';
import { root } from './profile';

const INPUTS = [
	'src',
	'static',
	'svelte.config.js',
	'vite.config.ts',
	'tailwind.config.ts',
	'postcss.config.js',
	'package-lock.json'
];

function newest(path: string): number {
	if (!existsSync(path)) return 0;
	const st = statSync(path);
	if (!st.isDirectory()) return st.mtimeMs;
	let max = st.mtimeMs;
	for (const entry of readdirSync(path)) max = Math.max(max, newest(join(path, entry)));
	return max;
}

/** Builds the app with adapter-node unless the build is newer than every input. */
export async function ensureBuild(slot?: string): Promise<string> {
	const out = join(root, slot ? `build-${slot}` : 'build');
	const stamp = join(out, '.built');
	const inputs = Math.max(...INPUTS.map((p) => newest(join(root, p))));
	if (existsSync(stamp) && statSync(stamp).mtimeMs > inputs) return out;
	console.log('• Building the app');
	// tsconfig.json extends the default output's tsconfig, which a slot's build does not write;
	// on a fresh checkout that has not run `svelte-kit sync` yet, write it first.
	if (!existsSync(join(root, '.svelte-kit/tsconfig.json'))) {
		const synced = await runCommand(join(root, 'node_modules/.bin/svelte-kit'), ['sync'], {
			cwd: root,
			env: { ...process.env, CORNICLE_SLOT: '' }
		});
		if (synced !== 0) throw new Error('svelte-kit sync failed');
	}
	const env = { ...process.env, ...(slot ? { CORNICLE_SLOT: slot } : {}) };
	const code = await runCommand(
		join(root, 'node_modules/.bin/vite'),
		['build', '--logLevel', 'error', '--bypass-lock'],
		{
			cwd: root,
			env
		}
	);
	if (code !== 0) throw new Error('vite build failed');
	writeFileSync(stamp, new Date().toISOString());
	return out;
}

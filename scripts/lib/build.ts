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

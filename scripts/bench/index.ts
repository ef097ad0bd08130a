import { join } from 'node:path';
import { runCommand } from '../lib/procs';
import { root, type Profile } from '../lib/profile';

/** `npm run bench`: each benchmark script in turn, printing its own figures. */
export async function runBench(_p: Profile, _args: string[]): Promise<number> {
	const tsx = join(root, 'node_modules/.bin/tsx');
	let failed = 0;
	for (const script of ['scripts/bench/engine.ts']) {
		console.log(`\n• ${script}`);
		if ((await runCommand(tsx, [script], { cwd: root })) !== 0) failed++;
	}
	return failed ? 1 : 0;
}

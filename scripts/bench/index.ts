import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { runCommand, startProcess } from '../lib/procs';
import { profileEnv, root, type Profile } from '../lib/profile';
import { startServices } from '../lib/stack';

/** Benchmark scripts, each printing its own figures; add new ones here. */
export const BENCHES = [
	'scripts/bench/engine.ts',
	'scripts/bench/ingest.ts',
	'scripts/bench/bundle.ts',
	'scripts/bench/map.ts',
	'scripts/bench/alerts.ts'
];

/**
 * `npm run bench`: starts the fakes and the built app on the bench database, then runs each
 * benchmark script with BENCH_APP_URL and DATABASE_URL set. `npm run bench -- engine` runs the
 * scripts whose path contains "engine"; `npm run bench -- path/to/script.ts` runs that script.
 */
export async function runBench(p: Profile, args: string[]): Promise<number> {
	const tsx = join(root, 'node_modules/.bin/tsx');
	// The outbox worker runs in a process of its own, as for a busy deployment (README,
	// "Running more than one instance"): the bench's visits raise hundreds of level alerts, and
	// sending them would otherwise share the app's one thread with the requests being measured.
	process.env.ALERTS_WORKER ??= 'off';
	const env = await startServices(p, { quiet: true });
	if (env.ALERTS_WORKER === 'off') {
		startProcess('alerts', tsx, ['src/lib/server/alerts/cli.ts'], {
			cwd: root,
			env: { ...env, ALERTS_WORKER: 'on' },
			quiet: true
		});
	}
	let failed = 0;
	// An argument that is a script's path runs that script (trying out a measurement).
	const own = args.filter((a) => a.endsWith('.ts') && existsSync(join(root, a)));
	const listed = BENCHES.filter((s) => !args.length || args.some((a) => s.includes(a)));
	for (const script of [...new Set([...listed, ...own])]) {
		console.log(`\n• ${script}`);
		const code = await runCommand(tsx, [script], {
			cwd: root,
			env: { ...process.env, ...profileEnv(p), BENCH_APP_URL: env.ORIGIN }
		});
		if (code !== 0) failed++;
	}
	return failed ? 1 : 0;
}

import type { ChildProcess } from 'node:child_process';
import { once } from 'node:events';
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
	// "Running more than one instance"), so sending alerts does not share the app's one thread
	// with the requests being measured. It is stopped while the ingest bench runs: that bench
	// measures filing visits (whose alerts are queued in the same transaction) against the raw
	// driver, and sending them through the mail and SMS fakes on the same two cores would weigh
	// on one side only. The ingest bench sends what its visits queued once it has measured.
	process.env.ALERTS_WORKER ??= 'off';
	const env = await startServices(p, { quiet: true });
	let worker: ChildProcess | null = null;
	const startWorker = () => {
		if (worker || env.ALERTS_WORKER !== 'off') return;
		worker = startProcess('alerts', tsx, ['src/lib/server/alerts/cli.ts'], {
			cwd: root,
			env: { ...env, ALERTS_WORKER: 'on' },
			quiet: true
		});
	};
	const stopWorker = async () => {
		if (!worker) return;
		const exited = once(worker, 'exit');
		worker.kill('SIGTERM');
		await exited;
		worker = null;
	};
	let failed = 0;
	// An argument that is a script's path runs that script (trying out a measurement).
	const own = args.filter((a) => a.endsWith('.ts') && existsSync(join(root, a)));
	const listed = BENCHES.filter((s) => !args.length || args.some((a) => s.includes(a)));
	for (const script of [...new Set([...listed, ...own])]) {
		if (script.endsWith('ingest.ts')) await stopWorker();
		else startWorker();
		console.log(`\n• ${script}`);
		const code = await runCommand(tsx, [script], {
			cwd: root,
			env: { ...process.env, ...profileEnv(p), BENCH_APP_URL: env.ORIGIN }
		});
		if (code !== 0) failed++;
	}
	await stopWorker();
	return failed ? 1 : 0;
}

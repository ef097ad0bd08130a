import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { runCommand } from './procs';
import { profileEnv, root, type Profile } from './profile';
import { startServices } from './stack';

const bin = (name: string) => join(root, 'node_modules/.bin', name);

interface VitestJson {
	numPassedTests: number;
	numFailedTests: number;
	numPendingTests: number;
	numTodoTests: number;
}

/**
 * The whole test run: type check, lint, then every vitest project (unit, database, HTTP and
 * browser) against this slot's MariaDB, fakes and built app. Ends with one summary line.
 * Arguments (file filters) skip the type check and lint and are passed to vitest.
 */
export async function runTests(p: Profile, args: string[]): Promise<number> {
	let passed = 0;
	let failed = 0;
	const quick = args.length > 0 || process.env.SKIP_CHECKS === '1';
	const step = async (label: string, cmd: string, cmdArgs: string[]) => {
		console.log(`\n• ${label}`);
		const code = await runCommand(cmd, cmdArgs, { cwd: root });
		if (code === 0) passed++;
		else failed++;
		console.log(code === 0 ? `  ${label}: ok` : `  ${label}: FAILED`);
	};
	if (!quick) {
		await step('Type check (svelte-check)', 'npm', ['run', '--silent', 'check']);
		await step('Lint (prettier + eslint)', 'npm', ['run', '--silent', 'lint']);
	}

	console.log('\n• Starting the fakes and the built app for the browser tests');
	const env = await startServices(p, { quiet: true });
	const report = join(p.dataDir, 'vitest.json');
	rmSync(report, { force: true });
	const code = await runCommand(
		bin('vitest'),
		['run', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...args],
		{
			cwd: root,
			env: {
				...process.env,
				...profileEnv(p),
				TEST_APP_URL: env.ORIGIN,
				CORNICLE_SLOT: p.slot ?? ''
			}
		}
	);
	if (existsSync(report)) {
		const r = JSON.parse(readFileSync(report, 'utf8')) as VitestJson;
		passed += r.numPassedTests;
		failed += r.numFailedTests;
		if (code !== 0 && r.numFailedTests === 0) failed++; // a suite that failed to load
	} else if (code !== 0) {
		failed++;
	}
	console.log(`\nSummary: ${passed} passed, ${failed} failed`);
	return failed === 0 && code === 0 ? 0 : 1;
}

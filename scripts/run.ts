// `npm start`, `npm test` and `npm run bench` after bootstrap.mjs has installed what was missing.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { DEMO_PASSWORD, DEMO_USERS } from '../src/lib/server/db/seeders/demo-people';
import { stopAll } from './lib/procs';
import { profile, root } from './lib/profile';
import { startDatabase, startServices, type MariaDB } from './lib/stack';
import { runTests } from './lib/tests';

if (existsSync(join(root, '.env'))) process.loadEnvFile(join(root, '.env'));

const [mode, ...args] = process.argv.slice(2);
let db: MariaDB | null = null;
let stopping = false;

async function shutdown(code: number) {
	if (stopping) return;
	stopping = true;
	await stopAll();
	await db?.stop();
	process.exit(code);
}
process.on('SIGINT', () => void shutdown(130));
process.on('SIGTERM', () => void shutdown(143));

async function start() {
	const p = profile('demo');
	db = await startDatabase(p);
	const env = await startServices(p);
	const pad = (s: string) => s.padEnd(34);
	console.log(`
  Cornicle is running.

  App         ${env.ORIGIN}
  Mail inbox  ${env.MAIL_INBOX_URL}${existsSync(join(root, 'mocks/sms/server.ts')) ? `\n  SMS inbox   ${env.TWILIO_BASE_URL}` : ''}

  Demo sign-ins (password for all: ${DEMO_PASSWORD})
${DEMO_USERS.map((u) => `    ${pad(u.email)} ${u.roleLabel}`).join('\n')}

  Ctrl-C stops everything started here.
`);
}

async function test() {
	const p = profile('test');
	db = await startDatabase(p, { fresh: true });
	const code = await runTests(p, args);
	await shutdown(code);
}

async function bench() {
	const p = profile('bench');
	db = await startDatabase(p, { fresh: true });
	const { runBench } = await import('./bench/index');
	const code = await runBench(p, args);
	await shutdown(code);
}

const modes: Record<string, () => Promise<void>> = { start, test, bench };
const fn = modes[mode];
if (!fn) {
	console.error(`Unknown mode "${mode}": use start, test or bench`);
	process.exit(2);
}
fn().catch(async (err) => {
	console.error(`\n✗ ${err instanceof Error ? err.message : err}`);
	await shutdown(1);
});

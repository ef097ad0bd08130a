#!/usr/bin/env node
// First step of `npm start`, `npm test` and `npm run bench`: make sure the machine has what the
// project needs (Debian packages, node_modules), then hand over to scripts/run.ts. Plain
// JavaScript on purpose: it must run before any dependency is installed.
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const [mode = 'start', ...rest] = process.argv.slice(2);

function run(cmd, args, opts = {}) {
	const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
	if (r.status !== 0) {
		console.error(`\n✗ ${cmd} ${args.join(' ')} failed (exit ${r.status ?? r.signal})`);
		process.exit(1);
	}
}

function have(path) {
	return existsSync(path);
}

function ensureDebianPackages() {
	const wanted = [];
	if (!have('/usr/sbin/mariadbd') && !have('/usr/bin/mariadbd')) wanted.push('mariadb-server');
	if ((mode === 'test' || mode === 'bench') && !have('/usr/bin/chromium')) wanted.push('chromium');
	if (!wanted.length) return;
	console.log(`• Installing from Debian's packages: ${wanted.join(', ')}`);
	const sudo = process.getuid?.() === 0 ? [] : ['sudo'];
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	const [cmd, ...pre] = [...sudo, 'apt-get'];
	run(cmd, [...pre, 'update', '-qq'], { env });
	run(cmd, [...pre, 'install', '-y', '-qq', '--no-install-recommends', ...wanted], { env });
}

function ensureNodeModules() {
	const lock = join(root, 'package-lock.json');
	const stampFile = join(root, 'node_modules', '.cornicle-install');
	const want = createHash('sha256')
		.update(readFileSync(join(root, 'package.json')))
		.update(existsSync(lock) ? readFileSync(lock) : '')
		.digest('hex');
	if (existsSync(stampFile) && readFileSync(stampFile, 'utf8') === want) return;
	console.log('• Installing npm packages');
	// A full, clean install on a fresh clone; an incremental one when packages changed.
	const fresh = !existsSync(join(root, 'node_modules'));
	run('npm', [fresh && existsSync(lock) ? 'ci' : 'install', '--no-audit', '--no-fund']);
	writeFileSync(stampFile, want);
}

ensureDebianPackages();
ensureNodeModules();

const child = spawn(join(root, 'node_modules', '.bin', 'tsx'), ['scripts/run.ts', mode, ...rest], {
	stdio: 'inherit',
	cwd: root
});
// The orchestrator handles Ctrl-C itself; keep this parent alive until it has cleaned up.
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => child.kill(sig));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));

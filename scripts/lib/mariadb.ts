import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';

export interface MariaDB {
	socket: string;
	port: number;
	/** Runs SQL as root over the socket. */
	sql(statements: string): void;
	stop(): Promise<void>;
}

function bin(name: string) {
	for (const dir of ['/usr/sbin', '/usr/bin'])
		if (existsSync(join(dir, name))) return join(dir, name);
	throw new Error(`${name} not found: install mariadb-server from Debian's packages`);
}

function alive(pid: number) {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
}

function ping(socket: string) {
	const r = spawnSync(
		bin('mariadb-admin'),
		['--no-defaults', `--socket=${socket}`, '-uroot', '--connect-timeout=2', 'ping'],
		{ stdio: 'pipe' }
	);
	return r.status === 0;
}

/**
 * Starts (or reuses) a MariaDB server of the project's own: its data directory under `dataDir`,
 * bound to 127.0.0.1 on `port`, with no system configuration read.
 */
export async function startMariaDB(
	dataDir: string,
	port: number,
	extraArgs: string[] = []
): Promise<MariaDB> {
	const datadir = join(dataDir, 'mysql');
	const socket = join(dataDir, 'mysqld.sock');
	const pidFile = join(dataDir, 'mysqld.pid');
	const errLog = join(dataDir, 'mysqld.err');
	mkdirSync(dataDir, { recursive: true });

	if (!existsSync(join(datadir, 'mysql'))) {
		const r = spawnSync(
			bin('mariadb-install-db'),
			[
				'--no-defaults',
				'--user=root',
				`--datadir=${datadir}`,
				'--auth-root-authentication-method=normal',
				'--skip-test-db'
			],
			{ stdio: 'pipe' }
		);
		if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stderr}`);
	}

	let ours = true;
	const oldPid = existsSync(pidFile) ? Number(readFileSync(pidFile, 'utf8').trim()) : 0;
	if (oldPid && alive(oldPid) && ping(socket)) {
		ours = false; // a server left by an earlier run that is still healthy
	} else {
		const child = spawn(
			bin('mariadbd'),
			[
				'--no-defaults',
				'--user=root',
				`--datadir=${datadir}`,
				`--socket=${socket}`,
				`--pid-file=${pidFile}`,
				`--port=${port}`,
				'--bind-address=127.0.0.1',
				'--skip-networking=0',
				'--skip-name-resolve',
				`--log-error=${errLog}`,
				'--innodb-buffer-pool-size=256M',
				'--innodb-flush-log-at-trx-commit=2',
				'--max-connections=400',
				...extraArgs
			],
			{ stdio: 'ignore', detached: true }
		);
		child.unref();
		const started = Date.now();
		while (!ping(socket)) {
			if (child.exitCode !== null || Date.now() - started > 30_000) {
				const log = existsSync(errLog) ? readFileSync(errLog, 'utf8').split('\n').slice(-15) : [];
				throw new Error(`MariaDB did not start on port ${port}:\n${log.join('\n')}`);
			}
			await sleep(150);
		}
	}

	const sql = (statements: string) => {
		const r = spawnSync(
			bin('mariadb'),
			['--no-defaults', `--socket=${socket}`, '-uroot', '-e', statements],
			{ stdio: 'pipe', encoding: 'utf8' }
		);
		if (r.status !== 0) throw new Error(`SQL failed: ${r.stderr}`);
	};

	return {
		socket,
		port,
		sql,
		async stop() {
			if (!ours && process.env.CORNICLE_KEEP_DB) return;
			const pid = existsSync(pidFile) ? Number(readFileSync(pidFile, 'utf8').trim()) : 0;
			spawnSync(
				bin('mariadb-admin'),
				['--no-defaults', `--socket=${socket}`, '-uroot', 'shutdown'],
				{
					stdio: 'ignore'
				}
			);
			const until = Date.now() + 30_000;
			while (pid && alive(pid) && Date.now() < until) await sleep(100);
		}
	};
}

/** Creates the application database and its user (idempotent); `fresh` drops it first. */
export function ensureDatabase(db: MariaDB, name: string, fresh = false) {
	db.sql(
		[
			fresh ? `DROP DATABASE IF EXISTS \`${name}\`;` : '',
			`CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
			`CREATE USER IF NOT EXISTS 'cornicle'@'127.0.0.1' IDENTIFIED BY 'cornicle';`,
			`GRANT ALL ON \`${name}\`.* TO 'cornicle'@'127.0.0.1';`,
			`GRANT ALL ON \`${name}_scratch%\`.* TO 'cornicle'@'127.0.0.1';`,
			`GRANT REPLICATION CLIENT, REPLICATION SLAVE ON *.* TO 'cornicle'@'127.0.0.1';`
		].join('\n')
	);
}

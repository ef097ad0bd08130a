import { spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { ensureDatabase, startMariaDB, type MariaDB } from './mariadb';

export interface ReplicatedPair {
	primary: MariaDB;
	replica: MariaDB;
	/** Waits until the replica has applied everything the primary has written. */
	caughtUp(timeoutMs?: number): Promise<void>;
	stop(): Promise<void>;
}

function status(db: MariaDB, sql: string): Record<string, string> {
	const r = spawnSync(
		'mariadb',
		['--no-defaults', `--socket=${db.socket}`, '-uroot', '-E', '-e', sql],
		{
			encoding: 'utf8'
		}
	);
	const out: Record<string, string> = {};
	for (const line of r.stdout.split('\n')) {
		const m = line.match(/^\s*(\w+):\s?(.*)$/);
		if (m) out[m[1]] = m[2];
	}
	return out;
}

/**
 * A primary and a replica of the project's own on loopback, with GTID replication from the
 * very first write, and the application database created on the primary.
 */
export async function startReplicatedPair(
	baseDir: string,
	ports: { primary: number; replica: number },
	dbName: string
): Promise<ReplicatedPair> {
	for (const d of ['primary', 'replica'])
		rmSync(join(baseDir, d), { recursive: true, force: true });
	const primary = await startMariaDB(join(baseDir, 'primary'), ports.primary, [
		'--server-id=1',
		'--log-bin=mysql-bin',
		'--binlog-format=ROW'
	]);
	const replica = await startMariaDB(join(baseDir, 'replica'), ports.replica, [
		'--server-id=2',
		'--relay-log=relay-bin'
	]);
	primary.sql(
		`CREATE USER 'repl'@'127.0.0.1' IDENTIFIED BY 'repl'; GRANT REPLICATION SLAVE ON *.* TO 'repl'@'127.0.0.1';`
	);
	replica.sql(
		`CHANGE MASTER TO MASTER_HOST='127.0.0.1', MASTER_PORT=${ports.primary}, MASTER_USER='repl', MASTER_PASSWORD='repl', MASTER_USE_GTID=slave_pos; START SLAVE;`
	);
	ensureDatabase(primary, dbName);

	const caughtUp = async (timeoutMs = 20_000) => {
		const until = Date.now() + timeoutMs;
		for (;;) {
			const master = status(primary, 'SELECT @@gtid_binlog_pos AS pos').pos ?? '';
			const s = status(replica, 'SHOW SLAVE STATUS');
			const applied = status(replica, 'SELECT @@gtid_slave_pos AS pos').pos ?? '';
			if (s.Slave_SQL_Running === 'Yes' && applied === master) return;
			if (s.Last_Error) throw new Error(`Replication stopped: ${s.Last_Error}`);
			if (Date.now() > until) throw new Error(`Replica did not catch up (${applied} vs ${master})`);
			await sleep(100);
		}
	};
	return {
		primary,
		replica,
		caughtUp,
		async stop() {
			await replica.stop();
			await primary.stop();
		}
	};
}

/** A server status counter (e.g. Com_select) read as root over the socket. */
export function statusCounter(db: MariaDB, name: string): number {
	return Number(status(db, `SHOW GLOBAL STATUS LIKE '${name}'`).Value ?? NaN);
}

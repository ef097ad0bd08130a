import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { config } from '../config';
import { Availability, isDatabaseUnavailable } from './availability';
import { connect, connectRaw } from './connect';

let primary: Sequelize | null = null;
let primaryState: Availability | null = null;
let replica: Sequelize | null | undefined;
let replicaHealthy = true;
let recheck: ReturnType<typeof setTimeout> | null = null;

const RECHECK_MS = 2_000;

/**
 * The app's shared Sequelize instance on the primary, opened on first use. While the primary is
 * known to be down (see `databaseFailed`), its pool acquires fail at once with a connection error.
 */
export function db(): Sequelize {
	if (!primary) {
		const url = config().DATABASE_URL;
		primary = connect({ url });
		primaryState = new Availability(url).guard(primary);
	}
	return primary;
}

/**
 * Tells the primary's watcher that a query failed; when the error means MariaDB is away, a
 * background probe confirms it and then checks every half second until it answers again.
 */
export function databaseFailed(error: unknown) {
	primaryState?.suspect(error);
}

/** True while the primary is known to be down (requests fail fast and answer 503). */
export function databaseKnownDown() {
	return primaryState?.down ?? false;
}

function replicaDb(): Sequelize | null {
	if (replica === undefined) {
		const url = config().DATABASE_REPLICA_URLS?.split(',').find(Boolean);
		replica = url
			? connectRaw({ url, pool: { max: 10, min: 0, acquire: 2_000, idle: 10_000 } })
			: null;
	}
	return replica;
}

function markReplicaDown() {
	replicaHealthy = false;
	if (recheck) return;
	recheck = setTimeout(async function probe() {
		try {
			await replicaDb()?.query('SELECT 1');
			replicaHealthy = true;
			recheck = null;
		} catch {
			recheck = setTimeout(probe, RECHECK_MS);
		}
	}, RECHECK_MS);
	recheck.unref?.();
}

/**
 * A read-only query for the heavy read screens (maps, triage, the regional overview): served by
 * the replica when one is configured and answering, else by the primary. A replica that stops
 * answering is skipped at once and probed again every two seconds.
 */
export async function readQuery<T extends object>(
	sql: string,
	replacements: unknown[] | Record<string, unknown> = []
): Promise<T[]> {
	const r = replicaDb();
	if (r && replicaHealthy) {
		try {
			return await r.query<T>(sql, { replacements, type: QueryTypes.SELECT });
		} catch (e) {
			if (!isDatabaseUnavailable(e)) throw e;
			markReplicaDown();
		}
	}
	try {
		return await db().query<T>(sql, { replacements, type: QueryTypes.SELECT });
	} catch (e) {
		databaseFailed(e);
		throw e;
	}
}

export * from './models';

const RETRYABLE = new Set([1213, 1205]); // deadlock, lock wait timeout

function isRetryable(e: unknown) {
	const errno =
		(e as { parent?: { errno?: number } })?.parent?.errno ??
		(e as { original?: { errno?: number } })?.original?.errno;
	return errno !== undefined && RETRYABLE.has(errno);
}

/**
 * A transaction on the primary that is run again (up to four times, after a short random wait)
 * when MariaDB picks it as a deadlock victim, as InnoDB expects of its clients. `fn` must be
 * safe to repeat: everything it wrote was rolled back.
 */
export async function transaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
	for (let attempt = 1; ; attempt++) {
		try {
			return await db().transaction(fn);
		} catch (e) {
			if (attempt >= 4 || !isRetryable(e)) {
				databaseFailed(e);
				throw e;
			}
			await new Promise((r) => setTimeout(r, 10 + Math.random() * 40 * attempt));
		}
	}
}

/** Closes the pools (on shutdown, after the server has stopped taking requests). */
export async function closeDatabases() {
	if (recheck) clearTimeout(recheck);
	await Promise.allSettled([primary?.close(), replica?.close()]);
	primary = null;
	replica = undefined;
}

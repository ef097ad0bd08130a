import { QueryTypes, type Sequelize } from 'sequelize';
import { isDatabaseUnavailable } from '../resilience';
import { config } from '../config';
import { connect, connectRaw } from './connect';

let primary: Sequelize | null = null;
let replica: Sequelize | null | undefined;
let replicaHealthy = true;
let recheck: ReturnType<typeof setTimeout> | null = null;

const RECHECK_MS = 2_000;

/** The app's shared Sequelize instance on the primary, opened on first use. */
export function db(): Sequelize {
	if (!primary) primary = connect({ url: config().DATABASE_URL });
	return primary;
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
	return db().query<T>(sql, { replacements, type: QueryTypes.SELECT });
}

export * from './models';

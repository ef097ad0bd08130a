import mariadb from 'mariadb';
import {
	ConnectionError,
	ConnectionRefusedError,
	ConnectionTimedOutError,
	TimeoutError,
	type Sequelize
} from 'sequelize';
import { parts } from './connect';

// Error codes that mean MariaDB could not be reached or went away, as opposed to a bad query.
// The ER_* codes of 45000 and up are the mariadb driver's own (node_modules/mariadb/lib/misc/
// errors.js); 1040, 1053 and 1927 are the server's (too many connections, shutdown in
// progress, connection killed).
const UNAVAILABLE_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH',
	'ENETUNREACH',
	'PROTOCOL_CONNECTION_LOST',
	'ER_GET_CONNECTION_TIMEOUT',
	'ER_CONNECTION_TIMEOUT',
	'ER_SOCKET_UNEXPECTED_CLOSE',
	'ER_SOCKET',
	'ER_SOCKET_TIMEOUT',
	'ER_CMD_CONNECTION_CLOSED',
	'ER_CONNECTION_ALREADY_CLOSED',
	'ER_CMD_NOT_EXECUTED_DESTROYED',
	'ER_CON_COUNT_ERROR',
	'ER_SERVER_SHUTDOWN',
	'ER_CONNECTION_KILLED'
]);
const UNAVAILABLE_ERRNOS = new Set([1040, 1053, 1927]);

/** True when an error means the database could not be reached (not a bad query). */
export function isDatabaseUnavailable(error: unknown): boolean {
	for (let e = error, depth = 0; e && depth < 4; depth++) {
		if (
			e instanceof ConnectionError ||
			e instanceof ConnectionRefusedError ||
			e instanceof ConnectionTimedOutError ||
			e instanceof TimeoutError
		) {
			return true;
		}
		const { code, errno } = e as { code?: string; errno?: number };
		if ((code && UNAVAILABLE_CODES.has(code)) || (errno && UNAVAILABLE_ERRNOS.has(errno))) {
			return true;
		}
		e =
			(e as { parent?: unknown; original?: unknown; cause?: unknown }).parent ??
			(e as { original?: unknown }).original ??
			(e as { cause?: unknown }).cause;
	}
	return false;
}

const PROBE_MS = 500;
const PROBE_TIMEOUT_MS = 2_000;

/**
 * Whether a Sequelize instance's MariaDB is known to be down. Once a request fails because the
 * database is away, a probe (one connection of its own, outside the pool) checks it; while the
 * probe fails every pool acquire fails at once, so requests answer 503 in milliseconds instead of
 * waiting for connection timeouts, and the probe runs again every half second until MariaDB
 * answers, when the pool is used again. Nothing here restarts the app.
 */
export class Availability {
	#down = false;
	#downSince = 0;
	#probing: Promise<boolean> | null = null;
	#timer: ReturnType<typeof setTimeout> | null = null;
	#stopped = false;
	#url: string;

	constructor(url: string) {
		this.#url = url;
	}

	get down() {
		return this.#down;
	}

	/** Seconds since the database was found down (0 when it is up). */
	get downForS() {
		return this.#down ? (Date.now() - this.#downSince) / 1000 : 0;
	}

	/**
	 * Makes every pool acquire of `sequelize` (and every new connection, such as Sequelize's first
	 * one that reads the server version) fail fast while the database is known down.
	 */
	guard(sequelize: Sequelize) {
		const check = () => {
			if (this.#down) throw new DatabaseDownError(this.downForS);
		};
		sequelize.addHook('beforePoolAcquire', check);
		sequelize.addHook('beforeConnect', check);
		return this;
	}

	/** Called when a query failed in a way that may mean the database is away: checks it. */
	suspect(error?: unknown) {
		if (error !== undefined && !isDatabaseUnavailable(error)) return;
		if (this.#down || this.#probing) return;
		void this.#check();
	}

	/**
	 * One probe: a fresh connection and a ping, the whole of it bounded by PROBE_TIMEOUT_MS (a
	 * host gone silent after the handshake must not hold the probe for TCP's own timeout).
	 * Resolves true when MariaDB answers.
	 */
	async probe(): Promise<boolean> {
		let conn: mariadb.Connection | null = null;
		let timer: ReturnType<typeof setTimeout> | undefined;
		const attempt = (async () => {
			const { host, port, username: user, password, database } = parts(this.#url);
			conn = await mariadb.createConnection({
				host,
				port,
				user,
				password,
				database,
				connectTimeout: PROBE_TIMEOUT_MS,
				socketTimeout: PROBE_TIMEOUT_MS
			});
			await conn.ping();
			return true;
		})();
		const late = new Promise<boolean>((resolve) => {
			timer = setTimeout(() => resolve(false), PROBE_TIMEOUT_MS + 500);
		});
		try {
			return await Promise.race([attempt, late]).catch(() => false);
		} finally {
			clearTimeout(timer);
			attempt.catch(() => false).finally(() => (conn as mariadb.Connection | null)?.destroy());
		}
	}

	async #check() {
		let up = false;
		try {
			this.#probing = this.probe();
			up = await this.#probing;
		} catch {
			up = false;
		} finally {
			this.#probing = null;
		}
		if (up) {
			if (this.#down) console.error(`database: back after ${this.downForS.toFixed(1)} s`);
			this.#down = false;
			return;
		}
		if (!this.#down) {
			this.#down = true;
			this.#downSince = Date.now();
			console.error('database: not answering; failing fast and probing every 0.5 s');
		}
		if (this.#stopped) return;
		this.#timer = setTimeout(() => void this.#check(), PROBE_MS);
		this.#timer.unref?.();
	}

	/** Stops probing (for tests and shutdown). */
	stop() {
		this.#stopped = true;
		if (this.#timer) clearTimeout(this.#timer);
		this.#timer = null;
	}
}

/** Thrown instead of acquiring a connection while the database is known down. */
export class DatabaseDownError extends ConnectionRefusedError {
	constructor(downForS: number) {
		super(
			Object.assign(
				new Error(
					`MariaDB has not answered for ${downForS.toFixed(1)} s (probed in the background)`
				),
				{ code: 'ECONNREFUSED' }
			)
		);
		this.name = 'DatabaseDownError';
	}
}

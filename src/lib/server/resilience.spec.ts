import { createServer, type Server } from 'node:net';
import type { RequestEvent } from '@sveltejs/kit';
import mariadb from 'mariadb';
import { ConnectionRefusedError, DatabaseError, Sequelize, UniqueConstraintError } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Availability, DatabaseDownError } from './db/availability';
import { databaseOutage, isDatabaseUnavailable, markDatabaseDown } from './resilience';

function eventFor(path: string): RequestEvent {
	return { url: new URL(`http://127.0.0.1${path}`), locals: {} } as unknown as RequestEvent;
}

/** What SvelteKit answers when handleError saw a database failure: a 500 with its own length. */
function kitError(event: RequestEvent, type: string, body: string) {
	markDatabaseDown(event);
	return new Response(body, {
		status: 500,
		headers: { 'content-type': type, 'content-length': String(Buffer.byteLength(body)) }
	});
}

async function outage(path: string, type: string, body: string) {
	const event = eventFor(path);
	const res = await databaseOutage({
		event,
		resolve: async () => kitError(event, type, body)
	} as Parameters<typeof databaseOutage>[0]);
	const text = await res.text();
	return { res, text };
}

describe('databaseOutage', () => {
	it('answers JSON 503 under /api/ with a length that matches the new body', async () => {
		const { res, text } = await outage(
			'/api/visits',
			'application/json',
			JSON.stringify({ message: 'The database is unavailable right now; a longer message.' })
		);
		expect(res.status).toBe(503);
		expect(res.headers.get('retry-after')).toBe('5');
		expect(res.headers.get('content-type')).toBe('application/json');
		// The bug this guards: the 500's content-length was kept on a shorter body, so the client
		// waited for bytes that never came and the connection was dropped.
		const length = res.headers.get('content-length');
		if (length !== null) expect(Number(length)).toBe(Buffer.byteLength(text));
		expect(JSON.parse(text).message).toMatch(/database is unavailable/i);
	});

	it('answers a page of its own to a browser', async () => {
		const { res, text } = await outage('/rounds', 'text/html', '<!doctype html><p>Error 500</p>');
		expect(res.status).toBe(503);
		expect(res.headers.get('content-type')).toMatch(/^text\/html/);
		expect(res.headers.get('retry-after')).toBe('5');
		expect(res.headers.get('content-length')).toBeNull();
		expect(text).toMatch(/cannot reach its database/i);
		expect(text).not.toMatch(/<script/i);
	});

	it("keeps SvelteKit's own JSON for data and form-action requests", async () => {
		const body = JSON.stringify({ type: 'error', error: { message: 'The database is away' } });
		const { res, text } = await outage('/rounds/__data.json', 'application/json', body);
		expect(res.status).toBe(503);
		expect(text).toBe(body);
		expect(res.headers.get('content-length')).toBe(String(Buffer.byteLength(body)));
	});

	it('leaves other errors alone', async () => {
		const event = eventFor('/api/visits');
		const res = await databaseOutage({
			event,
			resolve: async () => new Response('{"message":"x"}', { status: 500 })
		} as Parameters<typeof databaseOutage>[0]);
		expect(res.status).toBe(500);
	});
});

describe('isDatabaseUnavailable', () => {
	const sqlError = (code: string, errno: number) =>
		Object.assign(new Error(code), { code, errno, sqlState: 'HY000' });

	it('knows connection failures and a server going away', () => {
		expect(isDatabaseUnavailable(new ConnectionRefusedError(sqlError('ECONNREFUSED', 0)))).toBe(
			true
		);
		// A query on a connection the server closed (mariadb driver codes, errors.js).
		const closed = new DatabaseError(sqlError('ER_SOCKET_UNEXPECTED_CLOSE', 45009) as never);
		expect(isDatabaseUnavailable(closed)).toBe(true);
		expect(isDatabaseUnavailable(sqlError('ER_CMD_CONNECTION_CLOSED', 45013))).toBe(true);
		// The server shutting down (1053) or killing the connection (1927).
		expect(isDatabaseUnavailable(sqlError('ER_SERVER_SHUTDOWN', 1053))).toBe(true);
		expect(isDatabaseUnavailable(sqlError('X', 1927))).toBe(true);
	});

	it('does not take a bad query or a duplicate for an outage', () => {
		expect(isDatabaseUnavailable(new Error('boom'))).toBe(false);
		expect(isDatabaseUnavailable(new UniqueConstraintError({}))).toBe(false);
		const syntax = new DatabaseError(sqlError('ER_PARSE_ERROR', 1064) as never);
		expect(isDatabaseUnavailable(syntax)).toBe(false);
		expect(isDatabaseUnavailable(null)).toBe(false);
	});
});

describe('Availability', () => {
	// A port that accepts and at once closes connections: a database that is not answering.
	let server: Server;
	let url: string;
	beforeAll(async () => {
		server = createServer((s) => s.destroy());
		await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
		const port = (server.address() as { port: number }).port;
		url = `mariadb://u:p@127.0.0.1:${port}/nothing`;
	});
	afterAll(() => new Promise((r) => server.close(r)));

	it('finds the database down, then fails every query at once without touching the pool', async () => {
		const sequelize = new Sequelize('nothing', 'u', 'p', {
			dialect: 'mariadb',
			dialectModule: mariadb,
			host: '127.0.0.1',
			port: Number(new URL(url).port),
			logging: false,
			pool: { max: 2, min: 0, acquire: 20_000 },
			dialectOptions: { connectTimeout: 20_000 }
		});
		const state = new Availability(url).guard(sequelize);
		try {
			expect(await state.probe()).toBe(false);
			state.suspect(new ConnectionRefusedError(new Error('refused')));
			for (let i = 0; i < 50 && !state.down; i++) await new Promise((r) => setTimeout(r, 20));
			expect(state.down).toBe(true);
			const t = Date.now();
			await expect(sequelize.query('SELECT 1')).rejects.toBeInstanceOf(DatabaseDownError);
			expect(Date.now() - t).toBeLessThan(1_000); // not the 20 s acquire or connect timeouts
			expect(isDatabaseUnavailable(new DatabaseDownError(1))).toBe(true);
		} finally {
			state.stop();
			await sequelize.close();
		}
	});

	it('ignores an error that is not about reaching the database', () => {
		const state = new Availability(url);
		state.suspect(new Error('a bad query'));
		expect(state.down).toBe(false);
		state.stop();
	});
});

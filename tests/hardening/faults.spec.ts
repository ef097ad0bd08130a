import { randomUUID } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import mariadb from 'mariadb';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startMariaDB } from '../../scripts/lib/mariadb';
import {
	dataDir,
	ownDatabase,
	PORT_BASE,
	startApp,
	startSmsFake,
	type AppInstance,
	type MariaDB,
	type SmsFake
} from '../helpers/instance';

// Faults against servers of this test's own: kill -9 of the app during a steady stream of visit
// submissions, MariaDB stopped and restarted mid-stream, and the SMS provider down while alerts
// wait in the outbox. Figures are printed.
const DB_PORT = PORT_BASE + 7;
const APP_PORT = PORT_BASE + 8;
const RATE_PER_S = 50;

let db: MariaDB;
let dbUrl: string;
let app: AppInstance;
let blockIds: number[] = [];
let raw: mariadb.Pool;

async function signIn(url: string) {
	const res = await fetch(`${url}/signin?/password`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: url,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded'
		},
		body: new URLSearchParams({
			providerId: 'credentials',
			email: 'tomas@brackenridge.test',
			password: 'cornicle-demo',
			redirectTo: '/'
		})
	});
	return res.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.filter((c) => !c.endsWith('='))
		.join('; ');
}

/** A phone-like sender: each visit has its own key; failed sends wait in a queue for resending. */
function sender(url: () => string, cookie: string) {
	const answered = new Set<string>();
	const queue: string[] = [];
	const statuses = new Map<number | string, number>();
	const bodies = new Map<string, string>();
	const body = (key: string, i: number) => {
		const known = bodies.get(key);
		if (known) return known; // a resend is the same request, as the phone's queue keeps it
		const b = JSON.stringify({
			clientKey: key,
			blockId: blockIds[i % blockIds.length],
			visitedOn: new Date(Date.now() - (i % 20) * 86_400_000).toISOString().slice(0, 10),
			sampleUnit: 'plant',
			mode: 'count',
			counts: Array.from({ length: 10 }, (_, s) => ({ stop: s + 1, unit: 1, aphids: (i + s) % 40 }))
		});
		bodies.set(key, b);
		return b;
	};
	let n = 0;
	const send = async (key: string) => {
		try {
			const res = await fetch(`${url()}/api/visits`, {
				method: 'POST',
				headers: { 'content-type': 'application/json', cookie, origin: url() },
				body: body(key, n++),
				signal: AbortSignal.timeout(15_000)
			});
			await res.arrayBuffer();
			statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
			if (res.ok) answered.add(key);
			else queue.push(key);
			return res.status;
		} catch {
			statuses.set('network', (statuses.get('network') ?? 0) + 1);
			queue.push(key);
			return 0;
		}
	};
	/** Sends new visits at RATE_PER_S for `ms`, without waiting for answers. */
	const stream = async (ms: number) => {
		const inflight: Promise<unknown>[] = [];
		const until = Date.now() + ms;
		while (Date.now() < until) {
			inflight.push(send(`fault-${randomUUID()}`));
			await sleep(1000 / RATE_PER_S);
		}
		await Promise.all(inflight);
	};
	/** Resends the queue, 25 at a time, in rounds half a second apart until it is empty. */
	const drain = async () => {
		for (let round = 0; round < 20 && queue.length; round++) {
			const batch = queue.splice(0);
			for (let i = 0; i < batch.length; i += 25)
				await Promise.all(batch.slice(i, i + 25).map(send));
			if (queue.length) await sleep(500);
		}
	};
	/** A few visits one at a time first, so a fresh instance is warm before the stream. */
	const warm = async () => {
		for (let i = 0; i < 3; i++) await send(`warm-${randomUUID()}`);
		answered.clear();
		queue.length = 0;
		statuses.clear();
	};
	return { answered, queue, statuses, stream, drain, send, warm };
}

async function stored(prefix: string) {
	const rows = await raw.query(
		`SELECT client_key AS k, COUNT(*) AS n FROM visits WHERE client_key LIKE ? GROUP BY client_key`,
		[`${prefix}%`]
	);
	return new Map<string, number>(rows.map((r: { k: string; n: bigint }) => [r.k, Number(r.n)]));
}

beforeAll(async () => {
	({ db, url: dbUrl } = await ownDatabase('faults', DB_PORT));
	app = await startApp(APP_PORT, dbUrl, { ALERTS_WORKER: 'off' });
	const u = new URL(dbUrl);
	raw = mariadb.createPool({
		host: u.hostname,
		port: Number(u.port),
		user: 'cornicle',
		password: 'cornicle',
		database: 'cornicle_own',
		connectionLimit: 3
	});
	// The scout's own blocks, so visits land as they would from a phone on a round.
	const rows = await raw.query(
		`SELECT a.block_id AS id FROM scouting_assignments a JOIN users u ON u.id = a.scout_id
		  WHERE u.email = 'tomas@brackenridge.test' AND a.active = 1`
	);
	blockIds = rows.map((r: { id: number }) => Number(r.id));
});

afterAll(async () => {
	await app?.kill();
	await raw?.end().catch(() => {});
	await db?.stop();
});

describe('faults', () => {
	it('kill -9 of the app mid-stream loses no answered visit and stores none twice', async () => {
		const cookie = await signIn(app.url);
		const s = sender(() => app.url, cookie);
		await s.warm();
		const streaming = s.stream(5_000);
		const t = Date.now(); // kill once some visits are answered (bounded for a loaded machine)
		while (s.answered.size < 25 && Date.now() - t < 4_000) await sleep(50);
		const beforeKill = s.answered.size;
		await app.kill('SIGKILL');
		await streaming;
		app = await startApp(APP_PORT, dbUrl, { ALERTS_WORKER: 'off' });
		// The phone resends what failed, and (as a retry after a lost answer would) some that landed.
		const again = [...s.answered].slice(0, 20);
		s.queue.push(...again);
		await s.drain();
		const rows = await stored('fault-');
		const missing = [...s.answered].filter((k) => !rows.has(k));
		const doubled = [...rows.values()].filter((n) => n > 1).length;
		console.log(
			`Faults, kill -9: ${beforeKill} visits answered 2xx before the kill, ${s.answered.size} in all, ${missing.length} missing after restart, ${doubled} stored twice; answers ${JSON.stringify(Object.fromEntries(s.statuses))}`
		);
		expect(beforeKill, 'visits were answered before the kill').toBeGreaterThan(0);
		expect(s.statuses.get('network') ?? 0, 'the kill interrupted some requests').toBeGreaterThan(0);
		expect(missing).toEqual([]);
		expect(doubled).toBe(0);
		expect(s.queue).toEqual([]);
	});

	it('MariaDB stopped mid-stream: clear 503s while down, recovery without an app restart', async () => {
		const cookie = await signIn(app.url);
		const s = sender(() => app.url, cookie);
		await s.warm();
		const pid = app.proc.pid;
		const streaming = s.stream(6_000); // 50 visits a second from before the stop to after the start
		await sleep(1_000);
		await db.stop();
		const stoppedAt = Date.now();

		// A visit, a browser page and the health check while MariaDB is away: each a clear 503.
		const t = Date.now();
		const down = await fetch(`${app.url}/api/visits`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', cookie, origin: app.url },
			body: JSON.stringify({
				clientKey: `fault-${randomUUID()}`,
				blockId: blockIds[0],
				visitedOn: '2026-11-01',
				sampleUnit: 'plant',
				mode: 'count',
				counts: [{ stop: 1, unit: 1, aphids: 3 }]
			}),
			signal: AbortSignal.timeout(15_000)
		});
		const downMs = Date.now() - t;
		expect(down.status).toBe(503);
		expect(down.headers.get('retry-after')).toMatch(/^\d+$/);
		expect(((await down.json()) as { message: string }).message).toMatch(
			/database is unavailable/i
		);
		const page = await fetch(`${app.url}/rounds`, {
			headers: { cookie, accept: 'text/html' },
			redirect: 'manual',
			signal: AbortSignal.timeout(15_000)
		});
		expect(page.status).toBe(503);
		expect(page.headers.get('retry-after')).toMatch(/^\d+$/);
		expect(page.headers.get('content-type')).toMatch(/^text\/html/);
		expect(await page.text()).toMatch(/cannot reach its database/i);
		const health = await fetch(`${app.url}/api/health`, { signal: AbortSignal.timeout(15_000) });
		expect(health.status).toBe(503);
		expect(await health.json()).toMatchObject({ database: 'down' });

		// Answers while down come at once: the app knows the database is away and does not wait for
		// a pool acquire or a connect timeout each time.
		await sleep(1_500);
		const fast: number[] = [];
		for (let i = 0; i < 10; i++) {
			const t1 = Date.now();
			expect(await s.send(`fault-${randomUUID()}`)).toBe(503);
			fast.push(Date.now() - t1);
		}
		fast.sort((a, b) => a - b);
		const downFor = (Date.now() - stoppedAt) / 1000;

		db = await startMariaDB(dataDir('faults'), DB_PORT);
		const t0 = Date.now();
		let recovered = -1;
		while (Date.now() - t0 < 30_000) {
			const st = await s.send(`fault-${randomUUID()}`);
			if (st >= 200 && st < 300) {
				recovered = (Date.now() - t0) / 1000;
				break;
			}
			await sleep(100);
		}
		await streaming;
		const duringOutage = Object.fromEntries(s.statuses);
		const queued = s.queue.length;
		await s.drain(); // the phone's queue sends again what was refused
		const rows = await stored('fault-');
		const missing = [...s.answered].filter((k) => !rows.has(k));
		const doubled = [...rows.values()].filter((n) => n > 1).length;
		console.log(
			`Faults, MariaDB outage (${downFor.toFixed(1)} s down): answers ${JSON.stringify(duringOutage)}; ` +
				`a 503 in ${downMs} ms at the stop, then in ${fast[4]} ms (median, max ${fast[9]} ms); ` +
				`recovered ${recovered.toFixed(1)} s after MariaDB was back, same app process: ${app.proc.pid === pid}; ` +
				`${queued} queued visits resent, ${s.queue.length} left, ${missing.length} answered but missing, ${doubled} stored twice`
		);
		expect(duringOutage[500] ?? 0, 'no 500 while the database is away').toBe(0);
		expect(duringOutage.network ?? 0, 'no dropped connection while the database is away').toBe(0);
		expect(duringOutage[503] ?? 0).toBeGreaterThan(0);
		expect(fast[4], 'a 503 while known down comes without waiting for timeouts').toBeLessThan(
			2_000
		);
		expect(recovered).toBeGreaterThanOrEqual(0);
		expect(recovered, 'recovers by itself within seconds').toBeLessThan(15);
		expect(app.proc.exitCode).toBeNull();
		expect(app.proc.pid).toBe(pid);
		expect(s.queue).toEqual([]);
		expect(missing).toEqual([]);
		expect(doubled).toBe(0);
	});

	// Runs after the outage above, against the same (restarted) database.
	it('the SMS provider down for a while: alerts wait in the outbox and drain once it is back', async () => {
		const smsPort = PORT_BASE + 9;
		const sender = await startApp(PORT_BASE + 10, dbUrl, {
			ALERTS_WORKER: 'on',
			TWILIO_BASE_URL: `http://127.0.0.1:${smsPort}`,
			ALERTS_BACKOFF_MS: '300',
			ALERTS_BACKOFF_MAX_MS: '2000',
			ALERTS_MAX_ATTEMPTS: '50',
			ALERTS_POLL_MS: '200',
			ALERTS_SEND_TIMEOUT_MS: '2000'
		});
		let fake: SmsFake | null = null;
		try {
			const providerUp = await fetch(`http://127.0.0.1:${smsPort}/`).then(
				() => true,
				() => false
			);
			expect(providerUp, 'nothing answers on the provider port yet').toBe(false);
			const [org] = await raw.query(`SELECT id FROM organisations WHERE slug = 'brackenridge'`);
			const n = 30;
			await raw.batch(
				`INSERT INTO notifications (organisation_id, channel, kind, dedupe_key, to_address, body_text, status, attempts, not_before, created_at, updated_at)
				 VALUES (?, 'sms', 'test', ?, ?, ?, 'pending', 0, NOW(3), NOW(), NOW())`,
				Array.from({ length: n }, (_, i) => [
					org.id,
					`outage-${i}`,
					`+1701555${3000 + i}`,
					`Outage test ${i}`
				])
			);
			// The provider is down for at least 3 s and until every alert has been tried (bounded, for a
			// loaded machine): every attempt fails and the rows wait for another try.
			const downFrom = Date.now();
			let waiting: { pending: bigint; failed: bigint | null; tries: number; fewest: number };
			for (;;) {
				[waiting] = await raw.query(
					`SELECT SUM(status IN ('pending', 'sending')) AS pending, SUM(status = 'failed') AS failed,
					        MAX(attempts) AS tries, MIN(attempts) AS fewest
					   FROM notifications WHERE dedupe_key LIKE 'outage-%'`
				);
				const since = Date.now() - downFrom;
				if ((since >= 3_000 && Number(waiting.fewest) >= 1) || since > 20_000) break;
				await sleep(200);
			}
			const downS = (Date.now() - downFrom) / 1000;
			fake = await startSmsFake(smsPort);
			const t0 = Date.now();
			let done = 0;
			while (Date.now() - t0 < 30_000) {
				const [r] = await raw.query(
					`SELECT COUNT(*) AS n FROM notifications WHERE dedupe_key LIKE 'outage-%' AND status IN ('sent', 'delivered')`
				);
				done = Number(r.n);
				if (done === n) break;
				await sleep(200);
			}
			const drained = (Date.now() - t0) / 1000;
			const got = (await (await fetch(`http://127.0.0.1:${smsPort}/_fake/messages`)).json()) as {
				body: string;
			}[];
			const ours = got.filter((m) => m.body?.startsWith('Outage test'));
			const twice = ours.length - new Set(ours.map((m) => m.body)).size;
			console.log(
				`Faults, SMS provider down ${downS.toFixed(1)} s: ${Number(waiting.pending)} of ${n} alerts waiting (${Number(waiting.failed ?? 0)} failed, ${Number(waiting.fewest)}-${Number(waiting.tries)} tries each); drained ${done} in ${drained.toFixed(1)} s once back; ${ours.length} SMS received, ${twice} sent twice`
			);
			expect(Number(waiting.tries), 'the worker tried while the provider was down').toBeGreaterThan(
				0
			);
			expect(Number(waiting.pending)).toBe(n);
			expect(done).toBe(n);
			expect(ours.length).toBe(n);
			expect(twice).toBe(0);
		} finally {
			await fake?.stop();
			await sender.kill();
		}
	});
});

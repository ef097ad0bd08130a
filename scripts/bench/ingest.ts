// Visit ingest at 50 concurrent clients through the app's API (autocannon), beside inserting the
// same rows (read back from what the app stored) with the raw `mariadb` driver at the same
// concurrency, in the same run, the two taking turns.
import autocannon from 'autocannon';
import mariadb from 'mariadb';
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import { alertSettings } from '../../src/lib/server/alerts/settings';
import { AlertWorker } from '../../src/lib/server/alerts/worker';
import { connect } from '../../src/lib/server/db/connect';
import { cpuTicks, ms, percentile, signIn, stealBetween } from './stats';

const APP = process.env.BENCH_APP_URL!;
const DB = new URL(process.env.DATABASE_URL!);
const CONNECTIONS = 50;
const REQUESTS = Number(process.env.BENCH_INGEST_REQUESTS ?? 3000);
/**
 * Visits each side files first, unmeasured, in the same closed loop: the app's first thousand
 * visits run cold (code not yet optimised, pools and heap still growing, each block's season
 * read whole once), and a run that starts cold measures the warm-up as much as the ingest.
 */
const WARMUP = Number(process.env.BENCH_INGEST_WARMUP ?? 1500);
/** Turns each side takes (see the rounds below); each files REQUESTS / ROUNDS visits a turn. */
const ROUNDS = Number(process.env.BENCH_INGEST_ROUNDS ?? 3);
const PER_ROUND = Math.ceil(REQUESTS / ROUNDS);
const STOPS = 30;
const BLOCKS = 200;

async function pool() {
	return mariadb.createPool({
		host: DB.hostname,
		port: Number(DB.port),
		user: decodeURIComponent(DB.username),
		password: decodeURIComponent(DB.password),
		database: DB.pathname.slice(1),
		connectionLimit: CONNECTIONS
	});
}

/** Bench blocks of their own (copies of a demo soybean block) assigned to the demo scout. */
async function setUp(p: mariadb.Pool) {
	const [scout] = await p.query(`SELECT id FROM users WHERE email = 'tomas@brackenridge.test'`);
	const [tmpl] = await p.query(`SELECT * FROM blocks WHERE name = 'North Forty'`);
	const conn = await p.getConnection();
	try {
		await conn.beginTransaction();
		const ids: number[] = [];
		for (let i = 0; i < BLOCKS; i++) {
			const r = await conn.query(
				`INSERT INTO blocks (organisation_id, farm_id, crop_id, pest_id, name, plants_per_ha, area_ha,
				   boundary, centroid_lat, centroid_lon, min_lat, min_lon, max_lat, max_lon, rescout_days,
				   created_at, updated_at)
				 SELECT organisation_id, farm_id, crop_id, pest_id, ?, plants_per_ha, area_ha, boundary,
				   centroid_lat, centroid_lon, min_lat, min_lon, max_lat, max_lon, rescout_days, NOW(), NOW()
				   FROM blocks WHERE id = ?`,
				[`Ingest bench ${i}`, tmpl.id]
			);
			ids.push(Number(r.insertId));
			await conn.query(
				`INSERT INTO scouting_assignments (block_id, scout_id, interval_days, active, created_at, updated_at)
				 VALUES (?, ?, 7, 1, NOW(), NOW())`,
				[Number(r.insertId), scout.id]
			);
		}
		await conn.commit();
		return { blockIds: ids };
	} finally {
		conn.release();
	}
}

const day = (i: number) =>
	new Date(Date.now() - (60 - (i % 60)) * 86_400_000).toISOString().slice(0, 10);

function counts(seed: number) {
	return Array.from({ length: STOPS }, (_, s) => ({
		stop: s + 1,
		unit: 1,
		aphids: (seed * 7 + s * 13) % 90
	}));
}

interface AppRun {
	rate: number;
	ok: number;
	seconds: number;
	latencies: number[];
	statuses: Map<number, number>;
}

/** The visit body for the i-th visit of a run: blocks in turn, a day later each round. */
function visitBody(blockIds: number[], i: number, keys: string[]) {
	const clientKey = `bench-${randomUUID()}`;
	keys.push(clientKey);
	return JSON.stringify({
		clientKey,
		blockId: blockIds[i % blockIds.length],
		visitedOn: day(Math.floor(i / blockIds.length)),
		sampleUnit: 'plant',
		mode: 'count',
		bbch: 65,
		counts: counts(i)
	});
}

/**
 * One autocannon instance posting visits: closed loop (each connection sends again once
 * answered), or at a fixed rate per instance. `next` numbers the visits across instances.
 */
function cannon(
	blockIds: number[],
	keys: string[],
	cookie: string,
	next: { n: number },
	run: AppRun,
	opts: { connections: number; amount: number; rate?: number }
) {
	return new Promise<number>((resolve, reject) => {
		let last = performance.now();
		const inst = autocannon(
			{
				url: `${APP}/api/visits`,
				connections: opts.connections,
				amount: opts.amount,
				...(opts.rate ? { overallRate: opts.rate } : {}),
				timeout: 30,
				requests: [
					{
						method: 'POST',
						headers: { 'content-type': 'application/json', cookie, origin: APP },
						setupRequest(req) {
							req.body = visitBody(blockIds, next.n++, keys);
							return req;
						}
					}
				]
			},
			(err) => (err ? reject(err) : resolve(last))
		);
		inst.on('response', (_c, status, _b, time) => {
			last = performance.now();
			run.latencies.push(time);
			run.statuses.set(status, (run.statuses.get(status) ?? 0) + 1);
		});
	});
}

const finish = (run: AppRun, t0: number, last: number): AppRun => {
	// autocannon reports the end on its next one-second tick; the last answer is the end.
	const seconds = (last - t0) / 1000;
	const ok = [...run.statuses].filter(([s]) => s >= 200 && s < 300).reduce((a, [, k]) => a + k, 0);
	return { ...run, rate: ok / seconds, ok, seconds };
};

/** Several runs as one: every answer, over the time all of them took. */
function combined(runs: AppRun[]): AppRun {
	const statuses = new Map<number, number>();
	for (const r of runs)
		for (const [k, n] of r.statuses) statuses.set(k, (statuses.get(k) ?? 0) + n);
	const ok = runs.reduce((a, r) => a + r.ok, 0);
	const seconds = runs.reduce((a, r) => a + r.seconds, 0);
	return { rate: ok / seconds, ok, seconds, latencies: runs.flatMap((r) => r.latencies), statuses };
}

const newRun = (): AppRun => ({ rate: 0, ok: 0, seconds: 0, latencies: [], statuses: new Map() });

/** Visits through the app's API from 50 connections in a closed loop: the throughput. */
async function viaApp(blockIds: number[], keys: string[], amount: number) {
	const cookie = await signIn(APP, 'tomas@brackenridge.test');
	const run = newRun();
	const t0 = performance.now();
	const last = await cannon(blockIds, keys, cookie, { n: 0 }, run, {
		connections: CONNECTIONS,
		amount
	});
	return finish(run, t0, last);
}

/**
 * Visits at a fixed total rate from 50 clients whose sends are spread evenly over each second,
 * as phones in the field are: one autocannon instance of one connection per client, each
 * started 1/rate s after the one before. (One instance of 50 paced connections ticks them all
 * at once, so visits would arrive in bursts of 50 and wait for each other.)
 */
async function viaAppPaced(blockIds: number[], rate: number, amount: number) {
	const cookie = await signIn(APP, 'tomas@brackenridge.test');
	const run = newRun();
	const next = { n: 0 };
	const per = Math.ceil(amount / CONNECTIONS);
	const t0 = performance.now();
	const lasts = await Promise.all(
		Array.from({ length: CONNECTIONS }, (_, c) =>
			new Promise((r) => setTimeout(r, (c * 1000) / rate)).then(() =>
				cannon(blockIds, [], cookie, next, run, {
					connections: 1,
					amount: per,
					rate: rate / CONNECTIONS
				})
			)
		)
	);
	return finish(run, t0, Math.max(...lasts));
}

/** One client posting visits one after another (fetch), latencies in ms. */
async function oneAtATime(blockIds: number[], amount: number) {
	const cookie = await signIn(APP, 'tomas@brackenridge.test');
	const latencies: number[] = [];
	for (let i = 0; i < amount; i++) {
		const start = performance.now();
		const res = await fetch(`${APP}/api/visits`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', cookie, origin: APP },
			body: JSON.stringify({
				clientKey: `bench-${randomUUID()}`,
				blockId: blockIds[i % blockIds.length],
				visitedOn: day(0),
				sampleUnit: 'plant',
				mode: 'count',
				bbch: 65,
				counts: counts(i)
			})
		});
		await res.arrayBuffer();
		if (res.status !== 201) throw new Error(`one-at-a-time visit answered ${res.status}`);
		latencies.push(performance.now() - start);
	}
	return latencies;
}

type Row = Record<string, unknown>;

/** The rows the app stored for its visits: each visit with its counts and its assessment. */
async function storedRows(p: mariadb.Pool, keys: string[]) {
	const visits: Row[] = [];
	for (let i = 0; i < keys.length; i += 500) {
		visits.push(
			...(await p.query(`SELECT * FROM visits WHERE client_key IN (?)`, [keys.slice(i, i + 500)]))
		);
	}
	const ids = visits.map((v) => v.id);
	const countsOf = new Map<unknown, Row[]>();
	const assessmentOf = new Map<unknown, Row>();
	for (let i = 0; i < ids.length; i += 500) {
		const chunk = ids.slice(i, i + 500);
		for (const c of await p.query(`SELECT * FROM visit_counts WHERE visit_id IN (?)`, [chunk]))
			countsOf.set(c.visit_id, [...(countsOf.get(c.visit_id) ?? []), c]);
		for (const a of await p.query(`SELECT * FROM assessments WHERE visit_id IN (?)`, [chunk]))
			assessmentOf.set(a.visit_id, a);
	}
	return visits.map((v) => ({
		visit: v,
		counts: countsOf.get(v.id) ?? [],
		assessment: assessmentOf.get(v.id)
	}));
}

const insertOf = (table: string, row: Row) => {
	const cols = Object.keys(row).filter((c) => c !== 'id');
	return {
		sql: `INSERT INTO ${table} (${cols.join(', ')}) VALUES (${cols.map(() => '?').join(', ')})`,
		values: (r: Row) =>
			cols.map((c) =>
				r[c] !== null && typeof r[c] === 'object' && !(r[c] instanceof Date)
					? JSON.stringify(r[c])
					: r[c]
			)
	};
};

/**
 * The same rows inserted with the raw driver at the same concurrency, one transaction per
 * visit: the visit, its counts and (with `assessments`) its assessment row, byte for byte.
 */
async function viaDriver(
	p: mariadb.Pool,
	stored: Awaited<ReturnType<typeof storedRows>>,
	assessments: boolean
) {
	const latencies: number[] = [];
	const visitInsert = insertOf('visits', stored[0].visit);
	const countInsert = insertOf('visit_counts', stored[0].counts[0]);
	const assessmentInsert = stored[0].assessment && insertOf('assessments', stored[0].assessment);
	let next = 0;
	const t0 = performance.now();
	const worker = async () => {
		for (;;) {
			const i = next++;
			if (i >= stored.length) return;
			const { visit, counts, assessment } = stored[i];
			const start = performance.now();
			const conn = await p.getConnection();
			try {
				await conn.beginTransaction();
				const r = await conn.query(
					visitInsert.sql,
					visitInsert.values({ ...visit, client_key: `raw-${randomUUID()}` })
				);
				const visitId = Number(r.insertId);
				await conn.batch(
					countInsert.sql,
					counts.map((c) => countInsert.values({ ...c, visit_id: visitId }))
				);
				if (assessments && assessment && assessmentInsert)
					await conn.query(
						assessmentInsert.sql,
						assessmentInsert.values({ ...assessment, visit_id: visitId })
					);
				await conn.commit();
			} finally {
				conn.release();
			}
			latencies.push(performance.now() - start);
		}
	};
	await Promise.all(Array.from({ length: CONNECTIONS }, worker));
	const seconds = (performance.now() - t0) / 1000;
	return { rate: stored.length / seconds, seconds, latencies };
}

/**
 * Sends the alerts the bench's visits queued. The bench runner stops the outbox worker while
 * ingest is measured (scripts/bench/index.ts), so they wait in the outbox until now; an SMS
 * held for a subscriber's quiet hours stays held.
 */
async function sendQueued(p: mariadb.Pool, blockIds: number[]) {
	const counts = async () => {
		const [r] = await p.query(
			`SELECT COUNT(*) AS queued,
			   SUM(status IN ('pending', 'sending') AND not_before <= UTC_TIMESTAMP(3)) AS due,
			   SUM(status IN ('pending', 'sending') AND not_before > UTC_TIMESTAMP(3)) AS held,
			   SUM(status IN ('sent', 'delivered')) AS sent
			 FROM notifications WHERE block_id IN (?)`,
			[blockIds]
		);
		return {
			queued: Number(r.queued),
			due: Number(r.due ?? 0),
			held: Number(r.held ?? 0),
			sent: Number(r.sent ?? 0)
		};
	};
	const before = await counts();
	const settings = alertSettings(process.env);
	const sq = connect({ url: settings.DATABASE_URL });
	const worker = new AlertWorker({ sequelize: sq, settings, digests: false, overdue: false });
	const t0 = performance.now();
	worker.start();
	let now = before;
	while (now.due > 0 && performance.now() - t0 < 120_000) {
		await new Promise((r) => setTimeout(r, 50));
		now = await counts();
	}
	const seconds = (performance.now() - t0) / 1000;
	await worker.stop();
	await sq.close();
	return { before, after: now, seconds };
}

const p = await pool();
try {
	const ids = await setUp(p);
	// First one client filing one visit at a time (also warms the app up): the time to file one.
	const single = await oneAtATime(ids.blockIds, 200);
	if (WARMUP) {
		const warmKeys: string[] = [];
		await viaApp(ids.blockIds, warmKeys, WARMUP);
		if (!process.env.BENCH_INGEST_APP_ONLY) await viaDriver(p, await storedRows(p, warmKeys), true);
	}
	// The app and the raw driver take turns, a round each, so that both sides meet the same
	// machine: on a shared host the CPU the hypervisor gives to other guests (steal) swings
	// from a few per cent to over a third within minutes, and one long run of each compares
	// two different machines as much as two ways of writing.
	const appRounds: AppRun[] = [];
	const rawRounds: Awaited<ReturnType<typeof viaDriver>>[] = [];
	const steal: [number | null, number | null][] = [];
	const stored: Awaited<ReturnType<typeof storedRows>> = [];
	for (let r = 0; r < ROUNDS; r++) {
		const roundKeys: string[] = [];
		const t0 = cpuTicks();
		appRounds.push(await viaApp(ids.blockIds, roundKeys, PER_ROUND));
		if (process.env.BENCH_INGEST_APP_ONLY) continue;
		const t1 = cpuTicks();
		const rows = await storedRows(p, roundKeys);
		stored.push(...rows);
		rawRounds.push(await viaDriver(p, rows, true));
		steal.push([stealBetween(t0, t1), stealBetween(t1, cpuTicks())]);
	}
	const app = combined(appRounds);
	// BENCH_INGEST_APP_ONLY=1 stops after the app's rounds (for profiling the app with APP_NODE_ARGS).
	if (process.env.BENCH_INGEST_APP_ONLY) {
		console.log(
			`  app API: ${app.rate.toFixed(0)} visits/s; answers ${JSON.stringify(Object.fromEntries(app.statuses))}`
		);
		process.exit(0);
	}
	const raw = {
		rate: stored.length / rawRounds.reduce((a, r) => a + r.seconds, 0),
		latencies: rawRounds.flatMap((r) => r.latencies)
	};
	const rawLean = await viaDriver(p, stored, false);
	// Latency with the 50 clients sending at a fixed total rate rather than as fast as answers
	// come back (where p95 is the queue a closed loop of 50 builds in front of any server, the
	// raw driver's included): half the raw rate (the target throughput), and the steady field
	// stream the fault test sends (about 50 visits a second).
	const offered = Math.round(raw.rate / 2);
	const paced = await viaAppPaced(ids.blockIds, offered, Math.min(REQUESTS, offered * 10));
	const FIELD_RATE = 50;
	const field = await viaAppPaced(ids.blockIds, FIELD_RATE, FIELD_RATE * 10);
	const ratio = app.rate / raw.rate;
	const p95 = percentile(paced.latencies, 95);
	const line = (l: number[]) => `p50 ${ms(percentile(l, 50))}, p95 ${ms(percentile(l, 95))}`;
	console.log(
		`Visit ingest, ${PER_ROUND * ROUNDS} visits x ${STOPS} stops, ${CONNECTIONS} concurrent clients, app and raw driver in ${ROUNDS} alternating rounds (after ${WARMUP} unmeasured visits on each side)`
	);
	console.log(
		`  app API (autocannon):   ${app.rate.toFixed(0)} visits/s, ${line(app.latencies)}; answers ${JSON.stringify(Object.fromEntries(app.statuses))}`
	);
	console.log(
		`  raw mariadb driver:     ${raw.rate.toFixed(0)} visits/s, ${line(raw.latencies)} (the same rows: visit, ${STOPS} counts, assessment)`
	);
	console.log(
		`  raw, visit+counts only: ${rawLean.rate.toFixed(0)} visits/s, ${line(rawLean.latencies)} (for comparison: without the assessment row)`
	);
	console.log(
		`  app at ${offered} visits/s offered (half the raw rate, 50 clients): ${line(paced.latencies)}; answers ${JSON.stringify(Object.fromEntries(paced.statuses))}`
	);
	console.log(
		`  app at ${FIELD_RATE} visits/s offered (50 clients): ${line(field.latencies)}; answers ${JSON.stringify(Object.fromEntries(field.statuses))}`
	);
	console.log(`  app, one client, one visit at a time: ${line(single)}`);
	const pct = (n: number | null) => (n === null ? '?' : `${n.toFixed(0)} %`);
	console.log(
		`  rounds, app | raw visits/s (ratio; CPU steal during app | raw): ${appRounds
			.map(
				(a, k) =>
					`${a.rate.toFixed(0)} | ${rawRounds[k].rate.toFixed(0)} (${(a.rate / rawRounds[k].rate).toFixed(2)}; ${pct(steal[k][0])} | ${pct(steal[k][1])})`
			)
			.join(', ')}`
	);
	console.log(
		`  ratio app/raw: ${ratio.toFixed(2)} (target >= 0.50: ${ratio >= 0.5 ? 'met' : 'NOT met'}); p95 < 50 ms: at half the raw rate ${p95 < 50 ? 'met' : 'NOT met'}, at ${FIELD_RATE}/s ${percentile(field.latencies, 95) < 50 ? 'met' : 'NOT met'}, in the closed loop ${percentile(app.latencies, 95) < 50 ? 'met' : 'NOT met'} (raw driver there: ${ms(percentile(raw.latencies, 95))})`
	);
	// Other work on the machine slows both sides; the load average says how busy it was.
	console.log(
		`  (${os.cpus().length} CPUs, load average ${os
			.loadavg()
			.map((n) => n.toFixed(1))
			.join(' ')})`
	);
	const alerts = await sendQueued(p, ids.blockIds);
	console.log(
		`  alerts queued by these visits: ${alerts.before.queued} (${alerts.before.due} due, ${alerts.before.held} held for quiet hours); sent after the runs: ${alerts.after.sent} in ${alerts.seconds.toFixed(1)} s${alerts.after.due ? `; WARNING: ${alerts.after.due} still due` : ''}`
	);
	if (app.ok !== PER_ROUND * ROUNDS)
		console.log(`  WARNING: ${PER_ROUND * ROUNDS - app.ok} requests were not answered 2xx`);
} finally {
	await p.end();
}

// Visit ingest at 50 concurrent clients through the app's API (autocannon), beside inserting the
// same rows with the raw `mariadb` driver at the same concurrency, in the same run.
import autocannon from 'autocannon';
import mariadb from 'mariadb';
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import { ms, percentile, signIn } from './stats';

const APP = process.env.BENCH_APP_URL!;
const DB = new URL(process.env.DATABASE_URL!);
const CONNECTIONS = 50;
const REQUESTS = Number(process.env.BENCH_INGEST_REQUESTS ?? 3000);
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
	const [unit] = await p.query(`SELECT id FROM sample_units WHERE code = 'plant'`);
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
		return {
			blockIds: ids,
			scoutId: Number(scout.id),
			pestId: Number(tmpl.pest_id),
			unitId: Number(unit.id)
		};
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

async function viaApp(blockIds: number[]) {
	const cookie = await signIn(APP, 'tomas@brackenridge.test');
	let n = 0;
	const latencies: number[] = [];
	const statuses = new Map<number, number>();
	const result = await new Promise<autocannon.Result>((resolve, reject) => {
		const inst = autocannon(
			{
				url: `${APP}/api/visits`,
				connections: CONNECTIONS,
				amount: REQUESTS,
				timeout: 30,
				requests: [
					{
						method: 'POST',
						headers: { 'content-type': 'application/json', cookie, origin: APP },
						setupRequest(req) {
							const i = n++;
							req.body = JSON.stringify({
								clientKey: `bench-${randomUUID()}`,
								blockId: blockIds[i % blockIds.length],
								visitedOn: day(Math.floor(i / blockIds.length)),
								sampleUnit: 'plant',
								mode: 'count',
								bbch: 65,
								counts: counts(i)
							});
							return req;
						}
					}
				]
			},
			(err, res) => (err ? reject(err) : resolve(res))
		);
		inst.on('response', (_c, status, _b, time) => {
			latencies.push(time);
			statuses.set(status, (statuses.get(status) ?? 0) + 1);
		});
	});
	return { rate: result.requests.average, seconds: result.duration, latencies, statuses };
}

async function viaDriver(p: mariadb.Pool, ids: Awaited<ReturnType<typeof setUp>>) {
	const latencies: number[] = [];
	let next = 0;
	const t0 = performance.now();
	const worker = async () => {
		for (;;) {
			const i = next++;
			if (i >= REQUESTS) return;
			const start = performance.now();
			const conn = await p.getConnection();
			try {
				await conn.beginTransaction();
				const r = await conn.query(
					`INSERT INTO visits (block_id, scout_id, pest_id, sample_unit_id, client_key, visited_on,
					   position_source, outside_boundary, bbch, mode, mummies, ladybeetles, lacewings, hoverflies,
					   other_predators, created_at, updated_at)
					 VALUES (?, ?, ?, ?, ?, ?, 'none', 0, 65, 'count', 0, 0, 0, 0, 0, NOW(), NOW())`,
					[
						ids.blockIds[i % ids.blockIds.length],
						ids.scoutId,
						ids.pestId,
						ids.unitId,
						`raw-${randomUUID()}`,
						day(i)
					]
				);
				const rows = counts(i).map((c) => [
					Number(r.insertId),
					c.stop,
					c.unit,
					c.aphids,
					c.aphids > 0
				]);
				await conn.batch(
					`INSERT INTO visit_counts (visit_id, stop_no, unit_no, aphids, infested) VALUES (?, ?, ?, ?, ?)`,
					rows
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
	return { rate: REQUESTS / seconds, seconds, latencies };
}

const p = await pool();
try {
	const ids = await setUp(p);
	const raw = await viaDriver(p, ids);
	const app = await viaApp(ids.blockIds);
	const ok = [...app.statuses].filter(([s]) => s >= 200 && s < 300).reduce((a, [, n]) => a + n, 0);
	const p95 = percentile(app.latencies, 95);
	const ratio = app.rate / raw.rate;
	console.log(
		`Visit ingest, ${REQUESTS} visits x ${STOPS} stops, ${CONNECTIONS} concurrent clients`
	);
	console.log(
		`  app API (autocannon): ${app.rate.toFixed(0)} visits/s, p50 ${ms(percentile(app.latencies, 50))}, p95 ${ms(p95)}; answers ${JSON.stringify(Object.fromEntries(app.statuses))}`
	);
	console.log(
		`  raw mariadb driver:   ${raw.rate.toFixed(0)} visits/s, p50 ${ms(percentile(raw.latencies, 50))}, p95 ${ms(percentile(raw.latencies, 95))}`
	);
	console.log(
		`  ratio app/raw: ${ratio.toFixed(2)} (target >= 0.50: ${ratio >= 0.5 ? 'met' : 'NOT met'}); p95 target < 50 ms: ${p95 < 50 ? 'met' : 'NOT met'}`
	);
	// Other work on the machine slows both sides; the load average says how busy it was.
	console.log(
		`  (${os.cpus().length} CPUs, load average ${os
			.loadavg()
			.map((n) => n.toFixed(1))
			.join(' ')})`
	);
	if (ok !== REQUESTS) console.log(`  WARNING: ${REQUESTS - ok} requests were not answered 2xx`);
} finally {
	await p.end();
}

import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call } from '../helpers/app';
import { closeTestDb, testDb } from '../helpers/db';

const key = () => randomUUID().replaceAll('-', '');
let ids: Record<string, number> = {};

async function one<T extends object>(sql: string, replacements: unknown[] = []): Promise<T> {
	const [row] = await testDb().query<T>(sql, { replacements, type: QueryTypes.SELECT });
	return row;
}
const visitsOn = async (blockId: number) =>
	(await one<{ n: number }>('SELECT COUNT(*) AS n FROM visits WHERE block_id = ?', [blockId])).n;

beforeAll(async () => {
	const rows = await testDb().query<{ name: string; id: number }>(
		`SELECT name, id FROM blocks WHERE name IN ('North Forty', 'River Flat', 'Brask Soy West')`,
		{ type: QueryTypes.SELECT }
	);
	ids = Object.fromEntries(rows.map((r) => [r.name, r.id]));
});
afterAll(closeTestDb);

/** A complete count visit: 20 plants, one stop each (demo numbers). */
function visit(blockId: number, over: Record<string, unknown> = {}) {
	return {
		clientKey: key(),
		blockId,
		visitedOn: new Date().toISOString().slice(0, 10),
		position: { lat: 47.2248, lon: -96.948, source: 'gps' },
		bbch: 65,
		airTempC: 24.5,
		sampleUnit: 'plant',
		mode: 'count',
		counts: Array.from({ length: 20 }, (_, i) => ({
			stop: i + 1,
			unit: 1,
			aphids: 100 + i * 10,
			alate: i % 3
		})),
		enemies: { mummies: 4, ladybeetles: 1 },
		notes: 'API test visit',
		...over
	};
}

describe('POST /api/visits', () => {
	it('stores a visit with its counts, reassesses the block and answers the assessment', async () => {
		const body = visit(ids['North Forty']);
		const res = await call('/api/visits', { as: 'scout', json: body });
		expect(res.status).toBe(201);
		const out = await res.json();
		expect(out.visit.counts).toHaveLength(20);
		expect(out.visit.outsideBoundary).toBe(false);
		expect(['calm', 'stirring', 'action', 'severe']).toContain(out.assessment.level);
		expect(out.assessment.reason.length).toBeGreaterThan(10);
		// mean of 100..290 by 10 (computed)
		expect(out.assessment.mean).toBeCloseTo(195, 6);
		const a = await one<{ visitId: number }>(
			'SELECT visit_id AS visitId FROM assessments WHERE block_id = ? ORDER BY id DESC LIMIT 1',
			[ids['North Forty']]
		);
		expect(a.visitId).toBe(out.visit.id);
	});

	it('stores a replayed request once and answers the stored visit', async () => {
		const body = visit(ids['North Forty']);
		const first = await call('/api/visits', { as: 'scout', json: body });
		expect(first.status).toBe(201);
		const again = await call('/api/visits', { as: 'scout', json: body });
		expect(again.status).toBe(200);
		expect((await again.json()).visit.id).toBe((await first.json()).visit.id);
		// Two at once, as a flaky connection and a retry can make them.
		const body2 = visit(ids['North Forty']);
		const both = await Promise.all(
			[1, 2].map(() => call('/api/visits', { as: 'scout', json: body2 }))
		);
		expect(both.map((r) => r.status).sort()).toEqual([200, 201]);
		for (const k of [body.clientKey, body2.clientKey]) {
			const n = await one<{ n: number; c: number }>(
				'SELECT COUNT(DISTINCT v.id) AS n, COUNT(c.id) AS c FROM visits v JOIN visit_counts c ON c.visit_id = v.id WHERE v.client_key = ?',
				[k]
			);
			expect(n).toEqual({ n: 1, c: 20 });
		}
	});

	it('marks a position outside the block boundary', async () => {
		const res = await call('/api/visits', {
			as: 'scout',
			json: visit(ids['North Forty'], { position: { lat: 40, lon: -90, source: 'manual' } })
		});
		expect(res.status).toBe(201);
		expect((await res.json()).visit.outsideBoundary).toBe(true);
	});

	const refusals: [string, () => Record<string, unknown>, number, RegExp][] = [
		[
			'a negative count',
			() => ({ counts: [{ stop: 1, unit: 1, aphids: -3 }] }),
			400,
			/counts\.0\.aphids/
		],
		[
			'a non-integer count',
			() => ({ counts: [{ stop: 1, unit: 1, aphids: 2.5 }] }),
			400,
			/counts\.0\.aphids/
		],
		[
			'winged above the total',
			() => ({ counts: [{ stop: 1, unit: 1, aphids: 2, alate: 3 }] }),
			400,
			/counts\.0\.alate/
		],
		[
			'a text count',
			() => ({ counts: [{ stop: 1, unit: 1, aphids: 'many' }] }),
			400,
			/counts\.0\.aphids/
		],
		['an unknown block', () => ({ blockId: 99_999_999 }), 404, /No such block/],
		[
			'another organisation’s block',
			() => ({ blockId: ids['Brask Soy West'] }),
			404,
			/No such block/
		],
		[
			'a block the scout is not assigned to',
			() => ({ blockId: ids['River Flat'] }),
			403,
			/not assigned/
		],
		['an unknown sample unit', () => ({ sampleUnit: 'branch' }), 400, /sampleUnit/],
		['a photo that is not the scout’s', () => ({ photoIds: [99_999_999] }), 400, /photoIds/]
	];
	for (const [what, over, status, msg] of refusals) {
		it(`refuses ${what} and stores nothing`, async () => {
			const body = visit(ids['North Forty'], over());
			const before = await visitsOn(Number(body.blockId));
			const res = await call('/api/visits', { as: 'scout', json: body });
			expect(res.status).toBe(status);
			const out = await res.json();
			expect(JSON.stringify(out)).toMatch(msg);
			if (status === 400 && out.issues?.length) expect(out.issues[0].path).toBeTruthy();
			expect(await visitsOn(Number(body.blockId))).toBe(before);
			const k = await one<{ n: number }>('SELECT COUNT(*) AS n FROM visits WHERE client_key = ?', [
				body.clientKey
			]);
			expect(k.n).toBe(0);
		});
	}

	it('refuses growers, coordinators and anonymous callers', async () => {
		const body = visit(ids['North Forty']);
		expect((await call('/api/visits', { as: 'grower', json: body })).status).toBe(403);
		expect((await call('/api/visits', { as: 'regional', json: body })).status).toBe(403);
		expect((await call('/api/visits', { as: null, json: body })).status).toBe(401);
		expect(
			(
				await call('/api/visits', {
					as: 'scout',
					body: 'not json',
					headers: { 'content-type': 'application/json' }
				})
			).status
		).toBe(400);
	});

	it('refuses a clientKey reused for another block', async () => {
		const body = visit(ids['North Forty']);
		expect((await call('/api/visits', { as: 'scout', json: body })).status).toBe(201);
		const res = await call('/api/visits', { as: 'agronomist', json: { ...body } });
		expect(res.status).toBe(409);
	});
});

describe('reading visits', () => {
	it('lists a block’s visits newest first and reads one, within the organisation only', async () => {
		const list = await call(`/api/blocks/${ids['North Forty']}/visits?limit=3`, { as: 'grower' });
		expect(list.status).toBe(200);
		const { visits } = await list.json();
		expect(visits.length).toBe(3);
		expect(visits[0].visitedOn >= visits[2].visitedOn).toBe(true);
		const one = await call(`/api/visits/${visits[0].id}`, { as: 'agronomist' });
		expect(one.status).toBe(200);
		expect((await one.json()).visit.id).toBe(visits[0].id);
		expect((await call(`/api/visits/${visits[0].id}`, { as: 'coopAgronomist' })).status).toBe(404);
		expect((await call(`/api/blocks/${ids['North Forty']}/visits`, { as: 'grower2' })).status).toBe(
			404
		);
		expect(
			(await call(`/api/blocks/${ids['North Forty']}/visits?since=yesterday`, { as: 'agronomist' }))
				.status
		).toBe(400);
	});

	it('exports a block’s visits as CSV with one row per unit', async () => {
		const res = await call(`/api/blocks/${ids['North Forty']}/visits.csv`, { as: 'agronomist' });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/text\/csv/);
		const lines = (await res.text()).trim().split(/\r?\n/);
		expect(lines[0]).toBe(
			'visit_ref,block_id,visited_on,sample_unit,stop,unit,aphids,alate,infested,bbch,air_temp_c,mummies,ladybeetles,lacewings,hoverflies,other_predators,notes'
		);
		const n = await one<{ n: number }>(
			'SELECT COUNT(*) AS n FROM visit_counts c JOIN visits v ON v.id = c.visit_id WHERE v.block_id = ?',
			[ids['North Forty']]
		);
		expect(lines.length - 1).toBe(n.n);
	});

	it('publishes an OpenAPI document built from the same schemas', async () => {
		const res = await call('/api/openapi.json', { as: null });
		expect(res.status).toBe(200);
		const doc = await res.json();
		expect(doc.openapi).toMatch(/^3\./);
		const v = doc.components.schemas.VisitCreate;
		expect(v.required).toEqual(
			expect.arrayContaining(['blockId', 'visitedOn', 'sampleUnit', 'mode', 'counts'])
		);
		expect(v.properties.counts.items.properties.aphids.minimum).toBe(0);
		expect(Object.keys(doc.paths)).toEqual(
			expect.arrayContaining(['/api/visits', '/api/blocks/{id}/visits'])
		);
	});
});

describe('POST /api/trap-readings', () => {
	it('stores a reading once per clientKey and refuses bad counts', async () => {
		const trap = await one<{ id: number }>(
			`SELECT t.id FROM traps t JOIN farms f ON f.id = t.farm_id WHERE f.name = 'Heronsbrook Farm'`
		);
		const body = {
			clientKey: key(),
			trapId: trap.id,
			readOn: new Date().toISOString().slice(0, 10),
			daysOut: 7,
			alateCounts: { 'soybean aphid': 12, 'other aphids': 3 },
			cardChanged: true
		};
		const a = await call('/api/trap-readings', { as: 'scout', json: body });
		expect(a.status).toBe(201);
		expect((await a.json()).reading.alateTotal).toBe(15);
		expect((await call('/api/trap-readings', { as: 'scout', json: body })).status).toBe(200);
		const n = await one<{ n: number }>(
			'SELECT COUNT(*) AS n FROM trap_readings WHERE client_key = ?',
			[body.clientKey]
		);
		expect(n.n).toBe(1);
		const bad = await call('/api/trap-readings', {
			as: 'scout',
			json: { ...body, clientKey: key(), alateCounts: { 'soybean aphid': -1 } }
		});
		expect(bad.status).toBe(400);
		const other = await one<{ id: number }>(
			`SELECT t.id FROM traps t JOIN farms f ON f.id = t.farm_id WHERE f.name = 'Brask Farm'`
		);
		expect(
			(
				await call('/api/trap-readings', {
					as: 'scout',
					json: { ...body, clientKey: key(), trapId: other.id }
				})
			).status
		).toBe(404);
	});
});

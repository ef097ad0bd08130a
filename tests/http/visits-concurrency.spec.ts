import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessBlock } from '../../src/lib/engine';
import { replayInputs, type StoredInputs } from '../../src/lib/server/assessment-input';
import { call } from '../helpers/app';
import { closeTestDb, testDb } from '../helpers/db';

// The visit write path answers from what it wrote and reads the engine's input as plain rows;
// these checks hold it to what a re-read and a fresh engine run give.

const key = () => randomUUID().replaceAll('-', '');
const today = () => new Date().toISOString().slice(0, 10);
let blockId = 0;

function rows<T extends object>(sql: string, replacements: unknown[] = []) {
	return testDb().query<T>(sql, { replacements, type: QueryTypes.SELECT });
}
const parsed = <T>(v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v) as T;

beforeAll(async () => {
	[{ id: blockId }] = await rows<{ id: number }>(
		`SELECT id FROM blocks WHERE name = 'North Forty'`
	);
});
afterAll(closeTestDb);

describe('POST /api/visits answer', () => {
	const bodies: [string, () => Record<string, unknown>][] = [
		[
			'a count visit with a start time, position and partial enemies',
			() => ({
				clientKey: key(),
				blockId,
				visitedOn: today(),
				startedAt: new Date(Date.now() - 3_600_789).toISOString(),
				position: { lat: 47.2248, lon: -96.948, source: 'gps' },
				bbch: 61,
				airTempC: 21.3,
				sampleUnit: 'plant',
				mode: 'count',
				tallyThreshold: 3,
				counts: Array.from({ length: 12 }, (_, i) => ({
					stop: Math.floor(i / 3) + 1,
					unit: (i % 3) + 1,
					aphids: i * 4,
					...(i % 2 ? { alate: 1 } : {})
				})),
				enemies: { ladybeetles: 2 },
				notes: '  trimmed  '
			})
		],
		[
			'a presence-absence visit',
			() => ({
				clientKey: key(),
				blockId,
				visitedOn: today(),
				sampleUnit: 'plant',
				mode: 'presence',
				counts: Array.from({ length: 10 }, (_, i) => ({ stop: i + 1, unit: 1, infested: i < 4 }))
			})
		]
	];
	for (const [what, body] of bodies) {
		it(`is what GET /api/visits/:id reads back, for ${what}`, async () => {
			const res = await call('/api/visits', { as: 'scout', json: body() });
			expect(res.status).toBe(201);
			const posted = (await res.json()).visit;
			const read = await call(`/api/visits/${posted.id}`, { as: 'scout' });
			expect(read.status).toBe(200);
			expect(posted).toEqual((await read.json()).visit);
		});
	}
});

describe('concurrent visits on one block', () => {
	it('stores each visit’s assessment over exactly the visits before it, as the engine gives', async () => {
		const n = 12;
		const answers = await Promise.all(
			Array.from({ length: n }, (_, i) =>
				call('/api/visits', {
					as: 'scout',
					json: {
						clientKey: key(),
						blockId,
						visitedOn: today(),
						sampleUnit: 'plant',
						mode: 'count',
						bbch: 65,
						counts: Array.from({ length: 20 }, (_, s) => ({
							stop: s + 1,
							unit: 1,
							aphids: (i * 37 + s * 11) % 400
						}))
					}
				})
			)
		);
		expect(answers.map((r) => r.status)).toEqual(Array(n).fill(201));
		const out = await Promise.all(answers.map((r) => r.json()));
		const all = await rows<{ id: number; visitedOn: string }>(
			'SELECT id, visited_on AS visitedOn FROM visits WHERE block_id = ? ORDER BY visited_on, id',
			[blockId]
		);
		for (const o of out) {
			const [a] = await rows<{ level: string; inputs: unknown; result: unknown }>(
				'SELECT level, inputs, result FROM assessments WHERE visit_id = ?',
				[o.visit.id]
			);
			const stored = parsed<StoredInputs>(a.inputs);
			// Stored by reference: the visits by id, not the season's counts again.
			expect(stored).not.toHaveProperty('visits');
			// Under the block's row lock, visits commit in id order: each sees all with a smaller id
			// (also when several arrive together and are written in one batch).
			const expected = all.filter((v) => v.id <= o.visit.id && v.visitedOn <= stored.asOf);
			expect(stored.visitIds).toEqual(expected.map((v) => v.id));
			const inputs = await replayInputs(stored);
			const last = inputs.visits[inputs.visits.length - 1];
			expect(last.units).toEqual(
				o.visit.counts.map((c: { aphids: number }) => ({ aphids: c.aphids }))
			);
			// The stored result is the engine's answer on those inputs, less its per-visit series.
			const { perVisit, ...again } = JSON.parse(JSON.stringify(assessBlock(inputs)));
			expect(parsed(a.result)).toEqual(again);
			expect(perVisit).toHaveLength(inputs.visits.length);
			expect(a.level).toBe(o.assessment.level);
		}
		const newest = out.reduce((x, y) => (y.visit.id > x.visit.id ? y : x));
		const [block] = await rows<{ level: string }>(
			'SELECT current_level AS level FROM blocks WHERE id = ?',
			[blockId]
		);
		expect(block.level).toBe(newest.assessment.level);
	});

	it('refuses only the visit at fault when visits arrive together', async () => {
		const body = (i: number, extra: Record<string, unknown> = {}) => ({
			clientKey: key(),
			blockId,
			visitedOn: today(),
			sampleUnit: 'plant',
			mode: 'count',
			counts: [{ stop: 1, unit: 1, aphids: i }],
			...extra
		});
		const sent = [
			...Array.from({ length: 8 }, (_, i) => body(i)),
			body(90, { photoIds: [2_000_000_000] }),
			body(91, { blockId: 2_000_000_000 }),
			body(92, { sampleUnit: 'no-such-unit' })
		];
		const answers = await Promise.all(
			sent.map((json) => call('/api/visits', { as: 'scout', json }))
		);
		const statuses = answers.map((r) => r.status);
		expect(statuses.slice(0, 8)).toEqual(Array(8).fill(201));
		expect(statuses.slice(8)).toEqual([400, 404, 400]);
		expect((await answers[8].json()).issues[0].path).toBe('photoIds');
		expect((await answers[10].json()).issues[0].path).toBe('sampleUnit');
		const keys = sent.map((b) => b.clientKey);
		const [{ n }] = await rows<{ n: number }>(
			'SELECT COUNT(*) AS n FROM visits WHERE client_key IN (?)',
			[keys]
		);
		expect(Number(n)).toBe(8);
	});

	it('stores a visit sent twice at once only once (the second answer is the replay)', async () => {
		const json = {
			clientKey: key(),
			blockId,
			visitedOn: today(),
			sampleUnit: 'plant',
			mode: 'count',
			counts: [{ stop: 1, unit: 1, aphids: 3 }]
		};
		const answers = await Promise.all(
			[1, 2, 3].map(() => call('/api/visits', { as: 'scout', json }))
		);
		expect(answers.map((r) => r.status).sort()).toEqual([200, 200, 201]);
		const ids = new Set(await Promise.all(answers.map(async (r) => (await r.json()).visit.id)));
		expect(ids.size).toBe(1);
		const [{ n }] = await rows<{ n: number }>(
			'SELECT COUNT(*) AS n FROM visits WHERE client_key = ?',
			[json.clientKey]
		);
		expect(Number(n)).toBe(1);
	});
});

describe('the batch’s kept seasons', () => {
	// The batch keeps each block's visits between batches; what another instance, the CSV
	// import or anyone else writes straight into MariaDB must still be in the next assessment.
	const post = (aphids: number) =>
		call('/api/visits', {
			as: 'scout',
			json: {
				clientKey: key(),
				blockId,
				visitedOn: today(),
				sampleUnit: 'plant',
				mode: 'count',
				counts: [{ stop: 1, unit: 1, aphids }]
			}
		});
	const storedIds = async (visitId: number) => {
		const [a] = await rows<{ inputs: unknown }>(
			'SELECT inputs FROM assessments WHERE visit_id = ?',
			[visitId]
		);
		return parsed<StoredInputs>(a.inputs).visitIds;
	};
	const allIds = async () =>
		(
			await rows<{ id: number }>(
				`SELECT id FROM visits WHERE block_id = ? AND visited_on <= ? ORDER BY visited_on, id`,
				[blockId, today()]
			)
		).map((r) => r.id);

	it('sees a visit written behind the app’s back, and one removed', async () => {
		expect((await post(4)).status).toBe(201);
		// Another writer adds a visit (a copy of the newest, with its counts) straight in MariaDB.
		const [newest] = await rows<{ id: number }>(
			'SELECT id FROM visits WHERE block_id = ? ORDER BY id DESC LIMIT 1',
			[blockId]
		);
		const [copy] = await testDb().query(
			`INSERT INTO visits (block_id, scout_id, pest_id, sample_unit_id, client_key, visited_on,
			   position_source, outside_boundary, mode, mummies, ladybeetles, lacewings, hoverflies,
			   other_predators, created_at, updated_at)
			 SELECT block_id, scout_id, pest_id, sample_unit_id, ?, visited_on, 'none', 0, mode,
			   0, 0, 0, 0, 0, NOW(), NOW() FROM visits WHERE id = ?`,
			{ replacements: [key(), newest.id] }
		);
		await testDb().query(
			`INSERT INTO visit_counts (visit_id, stop_no, unit_no, aphids, alate, infested)
			 SELECT ?, stop_no, unit_no, aphids, alate, infested FROM visit_counts WHERE visit_id = ?`,
			{ replacements: [copy, newest.id] }
		);
		const res = await post(5);
		expect(res.status).toBe(201);
		const second = await res.json();
		expect(await storedIds(second.visit.id)).toEqual(await allIds());
		// And one disappears (no screen removes visits; a database clean-up might).
		const [gone] = await rows<{ id: number }>(
			`SELECT id FROM visits WHERE block_id = ? AND client_key IS NOT NULL
			 ORDER BY id DESC LIMIT 1 OFFSET 1`,
			[blockId]
		);
		await testDb().query('DELETE FROM assessments WHERE visit_id = ?', {
			replacements: [gone.id]
		});
		await testDb().query('DELETE FROM visits WHERE id = ?', { replacements: [gone.id] });
		const res3 = await post(6);
		expect(res3.status).toBe(201);
		const third = await res3.json();
		const ids = await storedIds(third.visit.id);
		expect(ids).not.toContain(gone.id);
		expect(ids).toEqual(await allIds());
	});
});

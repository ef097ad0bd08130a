import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessBlock, type AssessBlockInput } from '../../src/lib/engine';
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
			const inputs = parsed<AssessBlockInput>(a.inputs);
			// Under the block's row lock, visits commit in id order: each sees all with a smaller id.
			const expected = all.filter((v) => v.id <= o.visit.id && v.visitedOn <= inputs.asOf);
			expect(inputs.visits.map((v) => v.id)).toEqual(expected.map((v) => v.id));
			const last = inputs.visits[inputs.visits.length - 1];
			expect(last.units).toEqual(
				o.visit.counts.map((c: { aphids: number }) => ({ aphids: c.aphids }))
			);
			expect(parsed(a.result)).toEqual(JSON.parse(JSON.stringify(assessBlock(inputs))));
			expect(a.level).toBe(o.assessment.level);
		}
		const newest = out.reduce((x, y) => (y.visit.id > x.visit.id ? y : x));
		const [block] = await rows<{ level: string }>(
			'SELECT current_level AS level FROM blocks WHERE id = ?',
			[blockId]
		);
		expect(block.level).toBe(newest.assessment.level);
	});
});

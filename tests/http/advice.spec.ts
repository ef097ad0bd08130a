import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Product, Recommendation } from '../../src/lib/server/db/models';
import { call } from '../helpers/app';
import { closeTestDb, testDb } from '../helpers/db';
import { day } from '../helpers/advice';

// Demo records: North Forty is Harlan's (grower), River Flat is June's (grower2), both in the
// advisory firm; Brask Soy West belongs to the co-op.
let ids: Record<string, number> = {};
let recId = 0;
const count = async (table: string) =>
	Number(
		(
			await testDb().query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${table}`, {
				type: QueryTypes.SELECT
			})
		)[0].n
	);

beforeAll(async () => {
	const rows = await testDb().query<{ name: string; id: number }>(
		`SELECT name, id FROM blocks WHERE name IN ('North Forty', 'River Flat', 'Brask Soy West')`,
		{ type: QueryTypes.SELECT }
	);
	ids = Object.fromEntries(rows.map((r) => [r.name, r.id]));
	// An issued recommendation on Harlan's block, made through the API as the agronomist.
	const res = await call('/api/recommendations', {
		as: 'agronomist',
		json: { blockId: ids['North Forty'], decision: 'rescout', rescoutBy: day(3), issue: true }
	});
	expect(res.status).toBe(201);
	recId = ((await res.json()) as { id: number }).id;
});
afterAll(closeTestDb);

describe('a grower reaches only their own farms', () => {
	it("gets 404 for another grower's block, report and recommendations", async () => {
		const nf = ids['North Forty'];
		for (const path of [
			`/blocks/${nf}`,
			`/blocks/${nf}/report`,
			`/blocks/${nf}/report?rec=${recId}`
		]) {
			expect((await call(path, { as: 'grower2' })).status, path).toBe(404);
			expect((await call(path, { as: 'grower' })).status, path).toBe(200);
		}
		expect((await call(`/api/recommendations?block=${nf}`, { as: 'grower2' })).status).toBe(404);
		const mine = await call('/api/recommendations', { as: 'grower2' });
		const list = (await mine.json()) as { recommendations: { id: number }[] };
		expect(list.recommendations.map((r) => r.id)).not.toContain(recId);
	});

	it("cannot acknowledge another grower's recommendation by API or form", async () => {
		expect(
			(await call(`/api/recommendations/${recId}/acknowledge`, { as: 'grower2', method: 'POST' }))
				.status
		).toBe(404);
		const form = await call('/my-farms?/acknowledge', {
			as: 'grower2',
			form: { id: String(recId) }
		});
		expect(form.status).toBe(404);
		expect((await Recommendation.findByPk(recId))!.status).toBe('issued');
		const own = await call(`/api/recommendations/${recId}/acknowledge`, {
			as: 'grower',
			method: 'POST'
		});
		expect(own.status).toBe(200);
		expect((await Recommendation.findByPk(recId))!.status).toBe('acknowledged');
	});

	it("another organisation's agronomist gets 404 for the block and its recommendations", async () => {
		const nf = ids['North Forty'];
		expect((await call(`/blocks/${nf}`, { as: 'coopAgronomist' })).status).toBe(404);
		expect((await call(`/api/recommendations?block=${nf}`, { as: 'coopAgronomist' })).status).toBe(
			404
		);
		const res = await call('/api/recommendations', {
			as: 'coopAgronomist',
			json: { blockId: nf, decision: 'no-action' }
		});
		expect(res.status).toBe(404);
	});
});

describe('only agronomists and admins give advice', () => {
	it('a scout is refused at the endpoint and at the form action, and nothing is saved', async () => {
		const before = await count('recommendations');
		const api = await call('/api/recommendations', {
			as: 'scout',
			json: { blockId: ids['North Forty'], decision: 'no-action', issue: true }
		});
		expect(api.status).toBe(403);
		const form = await call(`/blocks/${ids['North Forty']}/recommend?/issue`, {
			as: 'scout',
			form: { decision: 'no-action' }
		});
		expect(form.status).toBe(403);
		const grower = await call(`/blocks/${ids['North Forty']}/recommend?/issue`, {
			as: 'grower',
			form: { decision: 'no-action' }
		});
		expect(grower.status).toBe(403);
		expect(await count('recommendations')).toBe(before);
	});
});

describe('invalid input names the field and saves nothing', () => {
	it('the recommendation form without JavaScript: no decision, then treat without a product', async () => {
		const before = await count('recommendations');
		const path = `/blocks/${ids['River Flat']}/recommend?/issue`;
		const none = await call(path, { as: 'agronomist', form: { decision: '', notes: 'x' } });
		expect(none.status).toBe(400);
		expect(await none.text()).toContain('Choose a decision.');
		const treat = await call(path, {
			as: 'agronomist',
			form: { decision: 'treat', productId: '0', targetDate: '' }
		});
		expect(treat.status).toBe(400);
		const html = await treat.text();
		expect(html).toContain('Choose a product for a treat recommendation.');
		expect(html).toContain('Give the date the treatment is planned for.');
		expect(await count('recommendations')).toBe(before);
	});

	it('the JSON API answers 400 with the fields', async () => {
		const before = await count('recommendations');
		const res = await call('/api/recommendations', {
			as: 'agronomist',
			json: { blockId: ids['River Flat'], decision: 'treat' }
		});
		expect(res.status).toBe(400);
		const body = (await res.json()) as { issues: { path: string }[] };
		expect(body.issues.map((i) => i.path).sort()).toEqual(['productId', 'targetDate']);
		const bad = await call('/api/recommendations', {
			as: 'agronomist',
			json: { blockId: ids['River Flat'], decision: 'spray' }
		});
		expect(((await bad.json()) as { issues: { path: string }[] }).issues[0].path).toBe('decision');
		expect(await count('recommendations')).toBe(before);
	});

	it('the product form names each bad field and adds no product', async () => {
		const before = await Product.count();
		const res = await call('/library/products?/save', {
			as: 'agronomist',
			form: {
				name: '',
				activeIngredient: 'x',
				iracGroup: 'pyrethroid',
				rate: '-1',
				rateUnit: 'mL/ha',
				reiHours: '12',
				phiDays: '900',
				beeHazard: ''
			}
		});
		expect(res.status).toBe(400);
		const html = await res.text();
		for (const m of [
			'Give the product name as on the label.',
			'Write the IRAC group as on the label',
			'The rate must be above 0.',
			'A PHI over a year looks like a typing error.',
			'Choose the bee hazard from the label.'
		])
			expect(html).toContain(m);
		expect(await Product.count()).toBe(before);
	});

	it('the threshold form wants a source and an injury level above the action threshold', async () => {
		const res = await call('/library/thresholds?/save', {
			as: 'agronomist',
			form: {
				cropId: '1',
				pestId: '1',
				sampleUnitId: '1',
				bbchFrom: '60',
				bbchTo: '70',
				metric: 'mean',
				action: '250',
				injury: '100',
				label: 'Test rule',
				source: '',
				provenance: 'published'
			}
		});
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(html).toContain('The injury level must be above the action threshold.');
		expect(html).toContain('Name the source');
	});
});

describe('triage export', () => {
	it('gives the organisation’s blocks as CSV, most urgent first, and none of the co-op’s', async () => {
		const res = await call('/api/triage.csv', { as: 'agronomist' });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain('text/csv');
		const lines = (await res.text()).trim().split(/\r?\n/);
		expect(lines[0]).toMatch(/^urgency,block,farm/);
		expect(lines[1]).toMatch(/^1,/);
		expect(lines.join('\n')).not.toContain('Brask Soy West');
	});
});

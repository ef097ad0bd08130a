import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call } from '../helpers/app';
import { closeTestDb, testDb } from '../helpers/db';

let ids: Record<string, number> = {};
const count = async (sql: string) =>
	(await testDb().query<{ n: number }>(sql, { type: QueryTypes.SELECT }))[0].n;
const csvVisits = () => count(`SELECT COUNT(*) AS n FROM visits WHERE entry_channel = 'csv'`);

beforeAll(async () => {
	const rows = await testDb().query<{ name: string; id: number }>(
		`SELECT name, id FROM blocks WHERE name IN ('Creek Quarter', 'Home Wheat', 'Brask Soy West')`,
		{ type: QueryTypes.SELECT }
	);
	ids = Object.fromEntries(rows.map((r) => [r.name, r.id]));
});
afterAll(closeTestDb);

const HEAD = 'visit_ref,block_id,visited_on,sample_unit,stop,unit,aphids,alate,bbch,mummies';
const day = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);

function post(
	action: 'preview' | 'commit',
	text: string,
	as: 'agronomist' | 'scout' = 'agronomist'
) {
	const form = new FormData();
	form.set('file', new Blob([text], { type: 'text/csv' }), 'counts.csv');
	// As a browser without JavaScript: the answer is the page with the preview in it.
	return call(`/import?/${action}`, {
		as,
		method: 'POST',
		body: form,
		headers: { accept: 'text/html' }
	});
}

function sheet(rows: string[]) {
	return [HEAD, ...rows].join('\n');
}

const good = () =>
	sheet([
		...Array.from(
			{ length: 5 },
			(_, i) => `a,${ids['Creek Quarter']},${day},plant,${i + 1},1,${10 + i},1,65,0`
		),
		...Array.from(
			{ length: 6 },
			(_, i) =>
				`b,${ids['Home Wheat']},${day},tiller,${Math.floor(i / 3) + 1},${(i % 3) + 1},${i},0,55,1`
		)
	]);

describe('CSV import of counts', () => {
	it('previews a good file without storing, then imports it all', async () => {
		const before = await csvVisits();
		const p = await post('preview', good());
		expect(p.status).toBe(200);
		expect(await p.text()).toContain('All 11 rows look right: 2 visits');
		expect(await csvVisits()).toBe(before);
		const c = await post('commit', good());
		expect(c.status).toBe(200);
		expect(await c.text()).toContain('Imported 2 visits from 11 rows');
		expect(await csvVisits()).toBe(before + 2);
	});

	const bad: [string, (r: string[]) => string[], RegExp][] = [
		[
			'a negative count',
			(r) => r.map((x, i) => (i === 2 ? x.replace(/,12,1,65/, ',-12,1,65') : x)),
			/Row 4, column aphids: aphids cannot be negative/
		],
		[
			'a non-integer count',
			(r) => r.map((x, i) => (i === 1 ? x.replace(/,11,1,65/, ',11.5,1,65') : x)),
			/Row 3, column aphids: aphids must be a whole number/
		],
		[
			'a block of another organisation',
			(r) => [...r, `c,${ids['Brask Soy West']},${day},plant,1,1,4,0,65,0`],
			/Row 13, column block_id: no block \d+ in your organisation/
		],
		[
			'a bad date',
			(r) => r.map((x, i) => (i === 0 ? x.replace(day, '2026-13-45') : x)),
			/Row 2, column visited_on/
		],
		[
			'the same unit twice',
			(r) => [...r, r[0]],
			/Row 13, column unit: stop 1 unit 1 is already on line 2/
		]
	];
	for (const [what, edit, msg] of bad) {
		it(`refuses the whole file for ${what}, naming row and column`, async () => {
			const before = await csvVisits();
			const text = sheet(edit(good().split('\n').slice(1)));
			for (const action of ['preview', 'commit'] as const) {
				const res = await post(action, text);
				expect(res.status).toBe(400);
				const html = (await res.text()).replace(/<!--[^>]*-->/g, '');
				expect(html).toContain('Nothing was imported');
				expect(html).toMatch(msg);
			}
			expect(await csvVisits()).toBe(before);
		});
	}

	it('refuses a file without the required columns, and scouts', async () => {
		const res = await post('commit', 'block,date\n1,2026-01-01');
		expect(res.status).toBe(400);
		expect((await res.text()).replace(/<!--[^>]*-->/g, '')).toMatch(
			/Row 1, column block_id: the header has no block_id column/
		);
		expect((await post('preview', good(), 'scout')).status).toBe(403);
	});
});

import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { QueryTypes } from 'sequelize';
import { db } from '../../src/lib/server/db';
import { mapBlocks, mapTraps, regionRows } from '../../src/lib/server/queries/map';
import { weeksBetween } from '../../src/lib/map/weeks';

// The app's own db() connects to the test database (DATABASE_URL); nothing is faked.
let org = 0;
let regional = 0;
beforeAll(async () => {
	const rows = await db().query<{ k: string; id: number }>(
		`SELECT 'org' AS k, organisation_id AS id FROM blocks WHERE name = 'North Forty'
		 UNION ALL SELECT 'regional', id FROM organisations WHERE slug = 'willowmere-extension'`,
		{ type: QueryTypes.SELECT }
	);
	org = rows.find((r) => r.k === 'org')!.id;
	regional = rows.find((r) => r.k === 'regional')!.id;
});
afterAll(() => db().close());

/** Runs `fn` and counts the statements it sends to MariaDB. */
async function statements<T>(fn: () => Promise<T>) {
	const spy = vi.spyOn(db(), 'query');
	try {
		const result = await fn();
		return { result, count: spy.mock.calls.length };
	} finally {
		spy.mockRestore();
	}
}

describe('map queries send one statement each (no N+1)', () => {
	it('mapBlocks, also with a past day, a box and filters', async () => {
		const a = await statements(() => mapBlocks({ organisationId: org }, {}));
		expect(a.count).toBe(1);
		expect(JSON.parse(a.result).features.length).toBeGreaterThanOrEqual(9);
		const b = await statements(() =>
			mapBlocks(
				{ organisationId: org },
				{
					on: '2026-01-01',
					crop: 'soybean',
					bbox: { minLon: -97, minLat: 47, maxLon: -96.8, maxLat: 47.3 }
				},
				true
			)
		);
		expect(b.count).toBe(1);
		expect(
			JSON.parse(b.result).features.every(
				(f: { properties: { crop: string } }) => f.properties.crop === 'soybean'
			)
		).toBe(true);
	});

	it('mapTraps and regionRows', async () => {
		const t = await statements(() =>
			mapTraps({ organisationId: org }, { from: '2000-01-01', to: '2100-01-01' })
		);
		expect(t.count).toBe(1);
		expect(t.result.length).toBeGreaterThanOrEqual(3);
		const w = weeksBetween({});
		if (!('weeks' in w) || !w.weeks) throw new Error('weeks');
		const r = await statements(() => regionRows(regional, w.weeks));
		expect(r.count).toBe(1);
		// Both organisations of the valley are in it: at least the demo's six farms.
		expect(
			new Set(r.result.filter((x) => x.kind === 'farm').map((x) => x.farmId)).size
		).toBeGreaterThanOrEqual(6);
	});
});

import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../src/lib/server/db/seeders/demo';
import { FARMS } from '../../src/lib/server/db/seeders/demo-scenario';
import { closeTestDb, testDb } from '../helpers/db';

const SCENARIO_BLOCKS = FARMS.flatMap((f) => f.blocks.map((b) => b.name));

afterAll(closeTestDb);

const COUNTED = [
	'organisations',
	'users',
	'farms',
	'blocks',
	'visits',
	'visit_counts',
	'threshold_rules',
	'crops',
	'pests'
];

async function counts() {
	const out: Record<string, number> = {};
	for (const t of COUNTED) {
		const [row] = await testDb().query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${t}`, {
			type: QueryTypes.SELECT
		});
		out[t] = Number(row.n);
	}
	return out;
}

describe('demo seed', () => {
	it('is idempotent: a second run changes nothing', async () => {
		const before = await counts();
		expect(before.blocks).toBeGreaterThanOrEqual(10);
		expect(await seedDemo(testDb())).toBe('already present');
		expect(await counts()).toEqual(before);
	});

	it('gives every demo block a level from the engine and a season of visits', async () => {
		const rows = await testDb().query<{
			name: string;
			current_level: string | null;
			visits: number;
		}>(
			`SELECT b.name, b.current_level, COUNT(v.id) AS visits FROM blocks b
			   JOIN farms f ON f.id = b.farm_id JOIN organisations o ON o.id = f.organisation_id
			   LEFT JOIN visits v ON v.block_id = b.id
			  WHERE o.slug IN ('brackenridge', 'ostrander') AND b.name IN (?) GROUP BY b.id`,
			{ type: QueryTypes.SELECT, replacements: [SCENARIO_BLOCKS] }
		);
		expect(rows.length).toBe(SCENARIO_BLOCKS.length);
		for (const r of rows) {
			expect(r.current_level, r.name).toMatch(/^(calm|stirring|action|severe)$/);
			expect(Number(r.visits), r.name).toBeGreaterThanOrEqual(5);
		}
		// The scenario shows every level somewhere, so every screen has something to show.
		expect(new Set(rows.map((r) => r.current_level))).toEqual(
			new Set(['calm', 'stirring', 'action', 'severe'])
		);
	});
});

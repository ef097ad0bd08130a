// The map's block list is kept in memory while the blocks' fingerprint is unchanged. Every
// change made behind the app's back (straight into MariaDB, as another instance would) must
// show in the very next answer: a level, a name, a boundary, a new block, a scout's assignment.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ScoutingAssignment } from '../../src/lib/server/db/models';
import { call, signInCookie } from '../helpers/app';
import { soyIds } from '../helpers/advice';
import {
	buildBlock,
	buildFarm,
	buildOrganisation,
	buildUser,
	closeTestDb,
	testDb
} from '../helpers/db';

interface FC {
	features: {
		id: number;
		geometry: { type: string; coordinates: unknown };
		properties: Record<string, unknown>;
	}[];
}

afterAll(closeTestDb);

let agronomist = '';
let scout = '';
let scoutId = 0;
let farm: Awaited<ReturnType<typeof buildFarm>>;
let blockId = 0;

beforeAll(async () => {
	const org = await buildOrganisation();
	const a = await buildUser('agronomist', org.id);
	const s = await buildUser('scout', org.id);
	const grower = await buildUser('grower', org.id);
	farm = await buildFarm(org.id, grower.user.id);
	blockId = (await buildBlock(farm, await soyIds(), { currentLevel: 'calm' })).id;
	agronomist = await signInCookie(a.user.email, a.password);
	scout = await signInCookie(s.user.email, s.password);
	scoutId = s.user.id;
});

const map = async (cookie = agronomist) => {
	const res = await call('/api/map/blocks', { headers: { cookie } });
	expect(res.status).toBe(200);
	return (await res.json()) as FC;
};
const one = async () => (await map()).features.find((f) => f.id === blockId)!;
const sql = (q: string, r: unknown[]) => testDb().query(q, { replacements: r });

describe('the kept map list', () => {
	it('shows every change at once', async () => {
		expect((await one()).properties.level).toBe('calm');
		await map(); // answered from memory now

		await sql('UPDATE blocks SET current_level = ? WHERE id = ?', ['action', blockId]);
		expect((await one()).properties.level).toBe('action');

		await sql('UPDATE farms SET name = ? WHERE id = ?', ['Renamed Acres', farm.id]);
		expect((await one()).properties.farm).toBe('Renamed Acres');

		// A boundary of the same length (only digits change) still shows.
		const [[row]] = (await sql('SELECT boundary FROM blocks WHERE id = ?', [blockId])) as [
			{ boundary: unknown }[],
			unknown
		];
		const before = typeof row.boundary === 'string' ? row.boundary : JSON.stringify(row.boundary);
		const moved = before.replace(
			/(\d)(\D*)$/,
			(_, d: string, rest: string) => `${(Number(d) + 1) % 10}${rest}`
		);
		expect(moved).toHaveLength(before.length);
		await sql('UPDATE blocks SET boundary = ? WHERE id = ?', [moved, blockId]);
		expect(JSON.stringify((await one()).geometry)).toBe(JSON.stringify(JSON.parse(moved)));

		const added = await buildBlock(farm, await soyIds());
		expect((await map()).features.map((f) => f.id)).toContain(added.id);
	});

	it("follows a scout's assignments", async () => {
		expect((await map(scout)).features).toHaveLength(0);
		const a = await ScoutingAssignment.create({ blockId, scoutId, intervalDays: 7 });
		expect((await map(scout)).features.map((f) => f.id)).toEqual([blockId]);
		await sql('UPDATE scouting_assignments SET active = 0 WHERE id = ?', [a.id]);
		expect((await map(scout)).features).toHaveLength(0);
	});
});

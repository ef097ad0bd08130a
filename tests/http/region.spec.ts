import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { latLngToCell } from 'h3-js';
import { call, signInCookie, APP } from '../helpers/app';
import {
	buildBlock,
	buildFarm,
	buildOrganisation,
	buildUser,
	closeTestDb,
	testDb
} from '../helpers/db';
import { Assessment, Trap, TrapReading } from '../../src/lib/server/db/models';
import type { RegionOverview } from '../../src/lib/map/region';

// Every key the regional answer may hold; anything else (an id, a name, a position) fails.
const ALLOWED = new Set([
	'type',
	'resolution',
	'floor',
	'weeks',
	'withheldCells',
	'features',
	'geometry',
	'coordinates',
	'properties',
	'cell',
	'farms',
	'week',
	'levels',
	'median',
	'alatesPerTrapWeek',
	'traps',
	'calm',
	'stirring',
	'action',
	'severe'
]);
function keysOf(v: unknown, out = new Set<string>()): Set<string> {
	if (Array.isArray(v)) v.forEach((x) => keysOf(x, out));
	else if (v && typeof v === 'object')
		for (const [k, x] of Object.entries(v)) {
			out.add(k);
			keysOf(x, out);
		}
	return out;
}

let identifying: string[] = [];
beforeAll(async () => {
	const rows = await testDb().query<{ s: string }>(
		`SELECT name AS s FROM farms UNION SELECT name FROM blocks UNION SELECT u.name FROM users u
		 UNION SELECT u.email FROM users u UNION SELECT name FROM traps UNION SELECT locality FROM farms WHERE locality IS NOT NULL`,
		{ type: QueryTypes.SELECT }
	);
	identifying = rows.map((r) => r.s).filter((s) => s.length >= 5);
});
afterAll(closeTestDb);

async function overview(cookieOrAs: string, query = '') {
	const res = cookieOrAs.includes('=')
		? await fetch(`${APP}/api/region/cells${query}`, { headers: { cookie: cookieOrAs } })
		: await call(`/api/region/cells${query}`, { as: 'regional' });
	return { status: res.status, text: await res.text() };
}

describe('GET /api/region/cells for the demo regional coordinator', () => {
	it('holds no identifying field or value and no cell under the 3-farm floor', async () => {
		const { status, text } = await overview('regional');
		expect(status).toBe(200);
		const body = JSON.parse(text) as RegionOverview;
		expect([...keysOf(body)].filter((k) => !ALLOWED.has(k))).toEqual([]);
		for (const s of identifying) expect(text, `leaks "${s}"`).not.toContain(s);
		expect(body.features.length).toBeGreaterThan(0);
		for (const f of body.features) {
			expect(f.properties.farms).toBeGreaterThanOrEqual(3);
			expect(f.geometry.coordinates[0]).toHaveLength(7); // a closed hexagon
		}
		// Recount independently from the farms table with h3-js: other tests add farms to the demo
		// organisations, so the demo's own 4 + 1 + 1 split at resolution 5 is only the start.
		const farms = await testDb().query<{ lat: number; lon: number }>(
			`SELECT f.lat, f.lon FROM farms f JOIN organisations o ON o.id = f.organisation_id
			  WHERE o.region = 'Willowmere Valley'`,
			{ type: QueryTypes.SELECT }
		);
		const perCell = new Map<string, number>();
		for (const f of farms) {
			const c = latLngToCell(f.lat, f.lon, 5);
			perCell.set(c, (perCell.get(c) ?? 0) + 1);
		}
		const shown = [...perCell].filter(([, n]) => n >= 3);
		expect(body.features.map((f) => [f.properties.cell, f.properties.farms]).sort()).toEqual(
			shown.sort()
		);
		expect(body.withheldCells).toBe(perCell.size - shown.length);
		expect(perCell.get(latLngToCell(47.221, -96.951, 5))).toBeGreaterThanOrEqual(4); // Heronsbrook's cell
		expect(body.weeks).toHaveLength(10);
	});

	it('sees levels and flights building over the weeks', async () => {
		const body = JSON.parse((await overview('regional')).text) as RegionOverview;
		const weeks = body.features[0].properties.weeks;
		const assessed = weeks.filter((w) => w.levels);
		expect(assessed.length).toBeGreaterThan(3);
		expect(weeks.some((w) => w.alatesPerTrapWeek != null)).toBe(true);
	});

	it('keeps one resolution and answers 400 naming the field for a bad range', async () => {
		// A second resolution could be subtracted from the first to single out a farm.
		const a = JSON.parse((await overview('regional', '?res=6')).text) as RegionOverview;
		expect(a.resolution).toBe(5);
		const c = await overview('regional', '?from=2026-07-10&to=2026-07-01');
		expect(c.status).toBe(400);
		expect(JSON.parse(c.text).issues[0].path).toBe('from');
		const b = await overview('regional', '?from=2026-01-01&to=2026-12-01');
		expect(b.status).toBe(400);
		expect(JSON.parse(b.text).message).toMatch(/at most 26 weeks/);
	});
});

describe('the floor, in a region of its own', () => {
	let cookie = '';
	const region = `Floor test ${Date.now()}`;
	const lastMonday = (() => {
		const d = new Date();
		d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7));
		return d.toISOString().slice(0, 10);
	})();

	beforeAll(async () => {
		const [lib] = await testDb().query<{ cropId: number; pestId: number }>(
			`SELECT crop_id AS cropId, pest_id AS pestId FROM blocks WHERE name = 'North Forty'`,
			{ type: QueryTypes.SELECT }
		);
		const a = await buildOrganisation({ region });
		const b = await buildOrganisation({ region, kind: 'coop' });
		const viewerOrg = await buildOrganisation({ region, kind: 'extension' });
		const viewer = await buildUser('regional', viewerOrg.id);
		cookie = await signInCookie(viewer.user.email, viewer.password);
		// Three farms around one point (two organisations) and two farms 60 km away.
		const spots: [number, number, number][] = [
			[a.id, 45.1, -100.1],
			[a.id, 45.104, -100.104],
			[b.id, 45.098, -100.097],
			[b.id, 45.65, -100.1],
			[a.id, 45.652, -100.103]
		];
		for (const [i, [org, lat, lon]] of spots.entries()) {
			const grower = await buildUser('grower', org);
			const farm = await buildFarm(org, grower.user.id, {
				lat,
				lon,
				name: `Floorfarm ${i} ${region}`
			});
			const block = await buildBlock(farm, lib, { name: `Floorblock ${i} ${region}` });
			await Assessment.create({
				blockId: block.id,
				computedAt: new Date(`${lastMonday}T12:00:00Z`),
				level: i === 0 ? 'severe' : 'calm',
				reason: 'test',
				inputs: {},
				result: {}
			});
			// Only two of the three clustered farms read a trap this week.
			if (i < 2 || i > 2) {
				const trap = await Trap.create({
					organisationId: org,
					farmId: farm.id,
					name: `Floortrap ${i}`,
					kind: 'yellow-sticky',
					lat,
					lon
				});
				await TrapReading.create({
					trapId: trap.id,
					scoutId: grower.user.id,
					readOn: lastMonday,
					daysOut: 7,
					alateCounts: { 'test aphid': 5 },
					alateTotal: 5
				});
			}
		}
	});

	it('shows the 3-farm cell, withholds the 2-farm cell and the 2-farm trap figure', async () => {
		const { status, text } = await overview(cookie);
		expect(status).toBe(200);
		const body = JSON.parse(text) as RegionOverview;
		expect(body.features).toHaveLength(1);
		expect(body.withheldCells).toBe(1);
		expect(text).not.toMatch(/Floorfarm|Floorblock|Floortrap|Test grower/);
		const week = body.features[0].properties.weeks.at(-1)!;
		expect(week.week).toBe(lastMonday);
		expect(week.levels).toEqual({ calm: 2, stirring: 0, action: 0, severe: 1 });
		expect(week.median).toBe('calm');
		expect(week.alatesPerTrapWeek).toBeNull();
	});
});

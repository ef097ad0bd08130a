import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { call, type As } from '../helpers/app';
import {
	buildBlock,
	buildFarm,
	buildOrganisation,
	buildUser,
	closeTestDb,
	testDb
} from '../helpers/db';
import { Block } from '../../src/lib/server/db/models';

interface FC {
	type: string;
	features: { id: number; geometry: { type: string }; properties: Record<string, unknown> }[];
}
const get = async (path: string, as: As = 'agronomist') => {
	const res = await call(path, { as });
	return { status: res.status, body: (await res.json()) as FC & { issues?: { path: string }[] } };
};
// Factory blocks that other tests add to the demo organisation are named "Block <id>".
const names = (fc: FC) =>
	fc.features
		.map((f) => String(f.properties.name))
		.filter((n) => !n.startsWith('Block '))
		.sort();

const HERONSBROOK = ['Creek Quarter', 'Home Wheat', 'North Forty'];
let brackenridgeId = 0;
let soy = { cropId: 0, pestId: 0 };

beforeAll(async () => {
	const [row] = await testDb().query<{ org: number; cropId: number; pestId: number }>(
		`SELECT b.organisation_id AS org, b.crop_id AS cropId, b.pest_id AS pestId
		   FROM blocks b WHERE b.name = 'North Forty'`,
		{ type: QueryTypes.SELECT }
	);
	brackenridgeId = row.org;
	soy = { cropId: row.cropId, pestId: row.pestId };
});
afterAll(closeTestDb);

describe('GET /api/map/blocks', () => {
	it("gives the agronomist the organisation's blocks as GeoJSON polygons with levels", async () => {
		const { status, body } = await get('/api/map/blocks');
		expect(status).toBe(200);
		expect(body.type).toBe('FeatureCollection');
		expect(names(body)).toEqual(
			expect.arrayContaining([...HERONSBROOK, 'River Flat', 'Ridge Canola'])
		);
		expect(names(body)).not.toContain('Brask Soy West'); // the co-op's block
		const north = body.features.find((f) => f.properties.name === 'North Forty')!;
		expect(north.geometry.type).toBe('Polygon');
		expect(['calm', 'stirring', 'action', 'severe']).toContain(north.properties.level);
		expect(north.properties).toMatchObject({
			farm: 'Heronsbrook Farm',
			crop: 'soybean',
			drawn: true
		});
	});

	it('keeps to a bounding box, a crop and a pest', async () => {
		// Heronsbrook Farm's blocks lie within ~2 km east and 1 km north/south of 47.221 N, 96.951 W.
		const box = await get('/api/map/blocks?bbox=-96.96,47.21,-96.92,47.23');
		expect(names(box.body)).toEqual(HERONSBROOK);
		const wheat = await get('/api/map/blocks?crop=wheat');
		expect(names(wheat.body)).toEqual(['Home Wheat']);
		const gpa = await get('/api/map/blocks?pest=green-peach-aphid');
		expect(names(gpa.body)).toEqual(['Beet Strip', 'Seed Potatoes East']);
	});

	it('gives the levels as they stood on a past day (none before the season)', async () => {
		const before = new Date(Date.now() - 90 * 86_400_000).toISOString().slice(0, 10);
		const { body } = await get(`/api/map/blocks?on=${before}&crop=wheat`);
		const wheat = body.features.find((f) => f.properties.name === 'Home Wheat')!;
		expect(wheat.properties.level).toBeNull();
	});

	it('shows a grower only their own blocks, a scout only assigned ones', async () => {
		expect(names((await get('/api/map/blocks', 'grower')).body)).toEqual(HERONSBROOK);
		const scout = names((await get('/api/map/blocks', 'scout')).body);
		expect(scout).toContain('North Forty');
		expect(scout).not.toContain('River Flat'); // walked by the other scout
	});

	it('answers 400 naming the field for a bad bbox or date', async () => {
		const a = await get('/api/map/blocks?bbox=1,2,3');
		expect(a.status).toBe(400);
		expect(a.body.issues?.[0].path).toBe('bbox');
		const b = await get('/api/map/blocks?on=2026-13-45');
		expect(b.status).toBe(400);
		expect(b.body.issues?.[0].path).toBe('on');
	});
});

describe('GET /api/map/traps', () => {
	it("gives the organisation's traps with their latest catch", async () => {
		const { status, body } = await get('/api/map/traps?from=2000-01-01');
		expect(status).toBe(200);
		const farms = body.features.map((f) => f.properties.farm);
		expect(farms).toEqual(
			expect.arrayContaining(['Heronsbrook Farm', 'Calloway Bottoms', 'Fennick Acres'])
		);
		expect(farms).not.toContain('Brask Farm');
		const latest = body.features[0].properties.latest as { alateTotal: number; readOn: string };
		expect(latest.alateTotal).toBeGreaterThanOrEqual(0);
		expect(latest.readOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
	});

	it('answers 400 when from is after to', async () => {
		const r = await get('/api/map/traps?from=2026-07-10&to=2026-07-01');
		expect(r.status).toBe(400);
		expect(r.body.issues?.[0].path).toBe('from');
	});
});

describe('boundaries', () => {
	async function freshBlock() {
		const farm = await buildFarm(
			brackenridgeId,
			(await buildUser('grower', brackenridgeId)).user.id
		);
		return buildBlock(farm, soy, { boundary: null, currentLevel: 'action' });
	}
	// ~600 m x 450 m near 47.2 N (computed: 0.008 deg lon x 0.004 deg lat).
	const ring = [
		[-96.9, 47.2],
		[-96.892, 47.2],
		[-96.892, 47.204],
		[-96.9, 47.204],
		[-96.9, 47.2]
	];

	it('PUT stores a valid polygon with its area', async () => {
		const b = await freshBlock();
		const res = await call(`/api/blocks/${b.id}/boundary`, {
			as: 'agronomist',
			method: 'PUT',
			json: { type: 'Polygon', coordinates: [ring] }
		});
		expect(res.status).toBe(200);
		const body = (await res.json()) as { areaHa: number };
		expect(body.areaHa).toBeGreaterThan(25);
		expect(body.areaHa).toBeLessThan(29);
		const saved = await Block.findByPk(b.id);
		expect(saved!.boundary).toMatchObject({ type: 'Polygon' });
		expect(saved!.areaHa).toBe(body.areaHa);
		expect(saved!.maxLon).toBeCloseTo(-96.892, 6);
	});

	it('PUT refuses a bow-tie with a clear message and saves nothing', async () => {
		const b = await freshBlock();
		const bowtie = [ring[0], ring[2], ring[1], ring[3], ring[0]];
		const res = await call(`/api/blocks/${b.id}/boundary`, {
			as: 'agronomist',
			method: 'PUT',
			json: { type: 'Polygon', coordinates: [bowtie] }
		});
		expect(res.status).toBe(400);
		const body = (await res.json()) as { message: string; issues: { path: string }[] };
		expect(body.message).toMatch(/crosses itself/);
		expect(body.issues[0].path).toBe('boundary');
		expect((await Block.findByPk(b.id))!.boundary).toBeNull();
	});

	it("answers 404 for another organisation's block", async () => {
		const org = await buildOrganisation();
		const farm = await buildFarm(org.id, (await buildUser('grower', org.id)).user.id);
		const b = await buildBlock(farm, soy);
		const res = await call(`/api/blocks/${b.id}/boundary`, {
			as: 'agronomist',
			method: 'PUT',
			json: { type: 'Polygon', coordinates: [ring] }
		});
		expect(res.status).toBe(404);
		expect((await call(`/api/blocks/${b.id}/boundary`, { as: 'agronomist' })).status).toBe(404);
		expect((await call(`/blocks/${b.id}/boundary`, { as: 'agronomist' })).status).toBe(404);
	});

	it('the page takes a KML upload without JavaScript', async () => {
		const b = await freshBlock();
		const kml = `<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"><Placemark>
			<Polygon><outerBoundaryIs><LinearRing><coordinates>${ring.map((p) => p.join(',')).join(' ')}</coordinates></LinearRing></outerBoundaryIs></Polygon>
			</Placemark></kml>`;
		const body = new FormData();
		body.set('boundary', '');
		body.set(
			'file',
			new File([kml], 'field.kml', { type: 'application/vnd.google-earth.kml+xml' })
		);
		const res = await call(`/blocks/${b.id}/boundary`, {
			as: 'agronomist',
			body,
			headers: { accept: 'text/html' }
		});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/map?focus=${b.id}`);
		expect((await Block.findByPk(b.id))!.boundary).toMatchObject({ type: 'Polygon' });
	});

	it('the page names the problem in an uploaded file and saves nothing', async () => {
		const b = await freshBlock();
		const body = new FormData();
		body.set('file', new File(['{"type":"Point","coordinates":[-96.9,47.2]}'], 'spot.geojson'));
		const res = await call(`/blocks/${b.id}/boundary`, {
			as: 'agronomist',
			body,
			headers: { accept: 'text/html' }
		});
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('A Point cannot be a block boundary');
		expect((await Block.findByPk(b.id))!.boundary).toBeNull();
	});
});

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { launch, newPage, PHONE, signInAs } from '../helpers/browser';
import { buildBlock, buildFarm, buildUser, closeTestDb, testDb } from '../helpers/db';
import { Block } from '../../src/lib/server/db/models';

let browser: Browser;
let org = 0;
let lib = { cropId: 0, pestId: 0 };

beforeAll(async () => {
	browser = await launch();
	const [row] = await testDb().query<{ org: number; cropId: number; pestId: number }>(
		`SELECT organisation_id AS org, crop_id AS cropId, pest_id AS pestId FROM blocks WHERE name = 'North Forty'`,
		{ type: QueryTypes.SELECT }
	);
	org = row.org;
	lib = { cropId: row.cropId, pestId: row.pestId };
});
afterAll(async () => {
	await browser?.close();
	await closeTestDb();
});

async function freshBlock(level: 'action' | 'stirring') {
	const grower = await buildUser('grower', org);
	const farm = await buildFarm(org, grower.user.id, { lat: 47.3, lon: -96.7 });
	return buildBlock(farm, lib, { boundary: null, currentLevel: level });
}

async function openEditor(page: Page, id: number) {
	await page.goto(`/blocks/${id}/boundary`);
	await page.locator('.leaflet-draw-draw-polygon').waitFor();
}

const geojsonFile = (coordinates: number[][]) => ({
	name: 'field.geojson',
	mimeType: 'application/geo+json',
	buffer: Buffer.from(
		JSON.stringify({
			type: 'FeatureCollection',
			features: [
				{
					type: 'Feature',
					properties: {},
					geometry: { type: 'Polygon', coordinates: [coordinates] }
				}
			]
		})
	)
});
// About 600 m x 450 m (0.008 deg lon x 0.004 deg lat at 47.3 N, computed).
const square = [
	[-96.704, 47.301],
	[-96.696, 47.301],
	[-96.696, 47.305],
	[-96.704, 47.305],
	[-96.704, 47.301]
];

describe('block boundaries on the map', () => {
	it('draws a block, saves it and sees it shaded by its level', async () => {
		const block = await freshBlock('action');
		const { context, page } = await newPage(browser);
		await signInAs(page, 'agronomist');
		await openEditor(page, block.id);
		await page.locator('.leaflet-draw-draw-polygon').click();
		const box = (await page.getByTestId('boundary-map').boundingBox())!;
		const cx = box.x + box.width / 2;
		const cy = box.y + box.height / 2;
		// At zoom 14 near 47 N one pixel is about 6.5 m (Leaflet's Web Mercator), so 120 px ~ 780 m.
		const corners = [
			[cx - 60, cy - 40],
			[cx + 60, cy - 40],
			[cx + 60, cy + 40],
			[cx - 60, cy + 40]
		];
		for (const [x, y] of corners) {
			await page.mouse.click(x, y);
			await page.waitForTimeout(150);
		}
		await page.mouse.click(corners[0][0], corners[0][1]);
		await expect(page.getByTestId('boundary-area').textContent()).resolves.toMatch(
			/ha \(.* ac\), 4 corners/
		);
		await page.getByRole('button', { name: 'Save the boundary' }).click();
		await page.waitForURL(`**/map?focus=${block.id}`);
		const shape = page.locator(`path.block-${block.id}`);
		await shape.waitFor();
		await expect(shape.getAttribute('class')).resolves.toContain('level-action');
		await expect(shape.getAttribute('fill')).resolves.toBe('url(#cornicle-fill-action)');
		// The card names the level in words too, never by colour alone.
		const card = page.getByRole('region', { name: 'Selected on the map' });
		await expect(card.textContent()).resolves.toMatch(/Action due/);
		const saved = await Block.findByPk(block.id);
		expect(saved!.boundary!.coordinates[0]).toHaveLength(5);
		expect(saved!.areaHa).toBeGreaterThan(20);
		await context.close();
	});

	it('imports a GeoJSON file on a phone', async () => {
		const block = await freshBlock('stirring');
		const { context, page } = await newPage(browser, { viewport: PHONE });
		await signInAs(page, 'agronomist');
		await openEditor(page, block.id);
		await page.getByLabel('Import a file (GeoJSON or KML)').setInputFiles(geojsonFile(square));
		await expect(page.getByTestId('boundary-area').textContent()).resolves.toMatch(
			/^\s*2[5-9]\.\d\d ha/
		);
		await page.getByRole('button', { name: 'Save the boundary' }).click();
		await page.waitForURL(`**/map?focus=${block.id}`);
		const shape = page.locator(`path.block-${block.id}`);
		await shape.waitFor();
		await expect(shape.getAttribute('class')).resolves.toContain('level-stirring');
		expect((await Block.findByPk(block.id))!.boundary).toMatchObject({ type: 'Polygon' });
		await context.close();
	});

	it('names a self-crossing boundary and saves nothing', async () => {
		const block = await freshBlock('action');
		const { context, page } = await newPage(browser);
		await signInAs(page, 'agronomist');
		await openEditor(page, block.id);
		const bowtie = [square[0], square[2], square[1], square[3], square[0]];
		await page.getByLabel('Import a file (GeoJSON or KML)').setInputFiles(geojsonFile(bowtie));
		const alert = page.getByTestId('boundary-error');
		await expect(alert.textContent()).resolves.toMatch(/crosses itself near 47\.\d+° N/);
		await page.getByRole('button', { name: 'Save the boundary' }).click();
		await page.waitForLoadState('networkidle');
		expect(new URL(page.url()).pathname).toBe(`/blocks/${block.id}/boundary`);
		await expect(alert.textContent()).resolves.toMatch(/crosses itself/);
		expect((await Block.findByPk(block.id))!.boundary).toBeNull();
		await context.close();
	});
});

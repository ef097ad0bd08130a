import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { DESKTOP, launch, newPage, PHONE, signInAs } from '../helpers/browser';

// Screens are kept for people to look at (not compared): .data/screens/map-*.png
const SHOTS = join(import.meta.dirname, '../../.data/screens');
let browser: Browser;
beforeAll(async () => {
	mkdirSync(SHOTS, { recursive: true });
	browser = await launch();
});
afterAll(() => browser?.close());

describe('map views', () => {
	for (const [name, viewport] of [
		['phone', PHONE],
		['desktop', DESKTOP]
	] as const) {
		it(`the organisation map shows blocks by level with a legend (${name})`, async () => {
			const { context, page } = await newPage(browser, { viewport });
			await signInAs(page, 'agronomist');
			await page.goto('/map');
			await page.locator('path.level-shape').first().waitFor();
			expect(await page.locator('path.level-shape').count()).toBeGreaterThanOrEqual(9);
			await expect(page.getByRole('region', { name: 'Map legend' }).textContent()).resolves.toMatch(
				/Severe.*Action due.*Stirring.*Calm/s
			);
			await page.locator('.trap-pin').first().waitFor();
			// Phones: nothing wider than the screen.
			const overflow = await page.evaluate(() => document.documentElement.scrollWidth);
			expect(overflow).toBeLessThanOrEqual(viewport.width);
			// Click the largest shape once the map has stopped zooming (other tests add blocks to
			// the demo organisation, so the first shape may be tiny at the fitted zoom).
			const card = page.getByRole('region', { name: 'Selected on the map' });
			for (let tries = 0; tries < 3 && !(await card.isVisible()); tries++) {
				await page.waitForFunction(() => !document.querySelector('.leaflet-zoom-anim'));
				const shapes = page.locator('path.level-shape');
				const areas = await shapes.evaluateAll((els) =>
					els.map((e) => {
						const r = e.getBoundingClientRect();
						return r.width * r.height;
					})
				);
				await shapes.nth(areas.indexOf(Math.max(...areas))).click({ force: true });
				await card.waitFor({ timeout: 10_000 }).catch(() => undefined);
			}
			await card.waitFor();
			await page.screenshot({ path: join(SHOTS, `map-org-${name}.png`), fullPage: true });
			await context.close();
		});
	}

	it('filters by crop', async () => {
		const { context, page } = await newPage(browser);
		await signInAs(page, 'agronomist');
		await page.goto('/map');
		await page.locator('path.level-shape').first().waitFor();
		await page.getByLabel('Crop').selectOption('wheat');
		await page.getByRole('button', { name: 'Show' }).click();
		await page.waitForURL('**/map?crop=wheat');
		await page.waitForFunction(() => document.querySelectorAll('path.level-shape').length === 1);
		await expect(page.getByRole('status').first().textContent()).resolves.toMatch(/1 block /);
		await context.close();
	});

	it('the regional overview shows hexagons and moves week by week', async () => {
		for (const [name, viewport] of [
			['phone', PHONE],
			['desktop', DESKTOP]
		] as const) {
			const { context, page } = await newPage(browser, { viewport });
			await signInAs(page, 'regional');
			await page.locator('path.hex-cell').first().waitFor();
			const slider = page.getByLabel(/Week starting/);
			const last = await slider.getAttribute('aria-valuetext');
			await slider.focus();
			await page.keyboard.press('Home');
			await expect(slider.getAttribute('aria-valuetext')).resolves.not.toBe(last);
			await page.keyboard.press('End');
			const overflow = await page.evaluate(() => document.documentElement.scrollWidth);
			expect(overflow).toBeLessThanOrEqual(viewport.width);
			await page.screenshot({ path: join(SHOTS, `map-region-${name}.png`), fullPage: true });
			await context.close();
		}
	});

	it('the boundary editor opens on the stored polygon, ready to edit (phone)', async () => {
		const { context, page } = await newPage(browser, { viewport: PHONE });
		await signInAs(page, 'agronomist');
		await page.goto('/map');
		await page.getByRole('button', { name: /North Forty/ }).click();
		await page.getByRole('link', { name: 'Edit the boundary' }).click();
		await page.locator('.leaflet-draw-edit-edit').waitFor();
		await page.locator('path.level-shape').first().waitFor();
		const text = await page.getByLabel('Boundary as GeoJSON').inputValue();
		expect(JSON.parse(text)).toMatchObject({ type: 'Polygon' });
		const overflow = await page.evaluate(() => document.documentElement.scrollWidth);
		expect(overflow).toBeLessThanOrEqual(PHONE.width);
		await page.screenshot({ path: join(SHOTS, 'map-boundary-phone.png'), fullPage: true });
		await context.close();
	});
});

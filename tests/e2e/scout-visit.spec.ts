import { QueryTypes } from 'sequelize';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP } from '../helpers/app';
import { launch, PHONE, signInAs } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { pngBytes } from '../helpers/photos';

let browser: Browser;
let block: { id: number; lat: number; lon: number };
beforeAll(async () => {
	browser = await launch();
	[block] = await testDb().query<typeof block>(
		`SELECT id, centroid_lat AS lat, centroid_lon AS lon FROM blocks WHERE name = 'Creek Quarter'`,
		{ type: QueryTypes.SELECT }
	);
});
afterAll(async () => {
	await browser?.close();
	await closeTestDb();
});

describe('a scout files a visit on a phone', () => {
	it(
		'counts stop by stop, survives a reload, reviews the engine figures and sees the assessment',
		{ timeout: 180_000 },
		async () => {
			const context = await browser.newContext({
				baseURL: APP,
				viewport: PHONE,
				hasTouch: true,
				isMobile: true,
				geolocation: { latitude: block.lat, longitude: block.lon },
				permissions: ['geolocation']
			});
			const page = await context.newPage();
			await signInAs(page, 'scout');
			await page.getByRole('link', { name: 'Start a visit on Creek Quarter' }).click();
			await page.getByRole('heading', { level: 1, name: 'Creek Quarter' }).waitFor();

			await page.getByRole('button', { name: 'Use my position' }).click();
			await page.getByTestId('position').getByText('from the phone').waitFor();
			expect(await page.getByText("outside the block's boundary").count()).toBe(0);
			await page.getByLabel('Growth stage (BBCH)').selectOption('65');
			await page.getByLabel('Air temperature (°C)').fill('23.5');
			await page.getByRole('button', { name: /Start counting/ }).click();

			// 20 plants: 10 × (unit number) wingless and 1 winged on each (demo numbers).
			for (let i = 1; i <= 20; i++) {
				await page.getByRole('heading', { name: `Stop ${i} · whole plant 1` }).waitFor();
				for (let k = 0; k < i; k++)
					await page.getByRole('button', { name: 'Wingless plus 10' }).tap();
				await page.getByRole('button', { name: 'Winged plus one' }).tap();
				if (i === 6) {
					await page.reload();
					await page.getByRole('heading', { name: 'Stop 6 · whole plant 1' }).waitFor();
					expect(await page.getByLabel('Wingless count').textContent()).toBe('60');
					expect(await page.getByLabel('Winged count').textContent()).toBe('1');
				}
				if (i < 20) await page.getByRole('button', { name: 'Next whole plant' }).tap();
			}
			await page
				.getByTestId('live-decision')
				.getByText('Stop: every unit of the plan is counted')
				.waitFor();
			await page.getByRole('button', { name: 'Done counting' }).tap();

			await page.getByRole('button', { name: 'Mummies (parasitized aphids) plus one' }).tap();
			await page.getByRole('button', { name: 'Mummies (parasitized aphids) plus one' }).tap();
			await page.getByRole('button', { name: 'Lady beetles plus one' }).tap();
			await page.getByRole('textbox', { name: 'Notes' }).fill('Colonies on upper leaves');
			await page.getByLabel(/Photos/).setInputFiles({
				name: 'plant.png',
				mimeType: 'image/png',
				buffer: await pngBytes(120, 90, 3)
			});
			await page.getByRole('img', { name: /Photo 1/ }).waitFor();
			await page.getByRole('button', { name: 'Review ›' }).tap();

			const summary = page.getByTestId('summary');
			await summary.waitFor();
			const text = (await summary.textContent()) ?? '';
			expect(text).toContain('20 whole plants');
			// Mean of 11, 21, ..., 201 aphids (10 i + 1 winged): 106 (computed).
			expect(text).toContain('106');
			await page
				.screenshot({ path: '.data/test-1/scout-review-360.png', fullPage: true })
				.catch(() => {});
			await page.getByRole('button', { name: 'Save visit' }).tap();

			const assessment = page.getByTestId('assessment');
			await assessment.waitFor({ timeout: 20_000 });
			expect(await assessment.textContent()).toMatch(/Calm|Stirring|Action due|Severe/);

			const [v] = await testDb().query<Record<string, number | string>>(
				`SELECT v.id, v.mummies, v.ladybeetles, v.bbch, v.entry_channel AS channel, v.position_source AS pos,
			        (SELECT COUNT(*) FROM visit_counts c WHERE c.visit_id = v.id) AS units,
			        (SELECT SUM(c.aphids) FROM visit_counts c WHERE c.visit_id = v.id) AS aphids,
			        (SELECT COUNT(*) FROM photos p WHERE p.visit_id = v.id) AS photos,
			        (SELECT a.level FROM assessments a WHERE a.visit_id = v.id) AS level
			   FROM visits v WHERE v.block_id = ? ORDER BY v.id DESC LIMIT 1`,
				{ replacements: [block.id], type: QueryTypes.SELECT }
			);
			expect(v).toMatchObject({
				mummies: 2,
				ladybeetles: 1,
				bbch: 65,
				channel: 'phone',
				pos: 'gps',
				units: 20,
				photos: 1
			});
			expect(Number(v.aphids)).toBe(2120);
			expect(await assessment.textContent()).toContain(
				{ calm: 'Calm', stirring: 'Stirring', action: 'Action due', severe: 'Severe' }[
					v.level as string
				]
			);
			await context.close();
		}
	);
});

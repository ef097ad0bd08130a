import { QueryTypes } from 'sequelize';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP } from '../helpers/app';
import { launch, PHONE, signInAs } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';

let browser: Browser;
let ids: Record<string, number> = {};
const q = async (sql: string, r: unknown[] = []) =>
	Number(
		(await testDb().query<{ n: number }>(sql, { replacements: r, type: QueryTypes.SELECT }))[0].n
	);

beforeAll(async () => {
	browser = await launch();
	const rows = await testDb().query<{ k: string; id: number }>(
		`SELECT name AS k, id FROM blocks WHERE name IN ('Pea Field', 'Home Wheat')
		 UNION ALL SELECT 'trap', t.id FROM traps t JOIN farms f ON f.id = t.farm_id WHERE f.name = 'Heronsbrook Farm'`,
		{ type: QueryTypes.SELECT }
	);
	ids = Object.fromEntries(rows.map((r) => [r.k, r.id]));
});
afterAll(async () => {
	await browser?.close();
	await closeTestDb();
});

/** A short count visit: three units, then save. */
async function quickVisit(page: Page, blockId: number, unit: RegExp) {
	await page.goto(`/rounds/${blockId}/visit`);
	await page.getByRole('button', { name: /Start counting/ }).click();
	for (let i = 0; i < 3; i++) {
		await page.getByRole('button', { name: 'Wingless plus 5' }).click();
		await page.getByRole('button', { name: unit }).click();
	}
	await page.getByRole('button', { name: 'Done counting' }).click();
	await page.getByRole('button', { name: 'Review ›' }).click();
	await page.getByRole('button', { name: 'Save visit' }).click();
	await page.getByTestId('visit-sent').getByText('Waiting to send').waitFor();
}

describe('offline rounds', () => {
	it(
		'files two visits and a trap reading without signal; each arrives exactly once',
		{ timeout: 180_000 },
		async () => {
			const context = await browser.newContext({ baseURL: APP, viewport: PHONE });
			let page = await context.newPage();
			await signInAs(page, 'scout');
			await page
				.getByTestId('offline-ready')
				.getByText('Saved on this phone')
				.waitFor({ timeout: 30_000 });
			// The worker must be active before the connection goes (it installs in the background).
			await expect
				.poll(
					() =>
						page.evaluate(
							async () => (await navigator.serviceWorker.getRegistration('/rounds'))?.active?.state
						),
					{ timeout: 30_000 }
				)
				.toBe('activated');

			const before = {
				pea: await q('SELECT COUNT(*) AS n FROM visits WHERE block_id = ?', [ids['Pea Field']]),
				wheat: await q('SELECT COUNT(*) AS n FROM visits WHERE block_id = ?', [ids['Home Wheat']]),
				trap: await q('SELECT COUNT(*) AS n FROM trap_readings WHERE trap_id = ?', [ids.trap])
			};
			const now = async () => ({
				pea: await q('SELECT COUNT(*) AS n FROM visits WHERE block_id = ?', [ids['Pea Field']]),
				wheat: await q('SELECT COUNT(*) AS n FROM visits WHERE block_id = ?', [ids['Home Wheat']]),
				trap: await q('SELECT COUNT(*) AS n FROM trap_readings WHERE trap_id = ?', [ids.trap])
			});

			await context.setOffline(true);
			// Chromium's offline emulation once let the first visit's POST reach the server (a
			// clean-clone run, 2026-12-02), so the API is also made unreachable for every page of
			// the phone while it has no signal.
			await context.route('**/api/**', (r) => r.abort('internetdisconnected'));
			await quickVisit(page, ids['Pea Field'], /Next sweep/);
			expect(await page.evaluate(() => navigator.onLine)).toBe(false);
			await quickVisit(page, ids['Home Wheat'], /Next tiller/);
			await page.goto(`/rounds/traps/${ids.trap}`);
			await page.getByRole('button', { name: 'soybean aphid plus 5' }).click();
			await page.getByRole('button', { name: 'Save reading' }).click();
			await page.getByTestId('reading-saved').waitFor();

			// The browser tab closes; what waits is still on the phone.
			await page.close();
			page = await context.newPage();
			await page.goto('/rounds/outbox');
			await expect.poll(() => page.locator('li[data-status="waiting"]').count()).toBe(3);
			expect(await now()).toEqual(before);

			await context.unroute('**/api/**');
			await context.setOffline(false);
			await page.evaluate(() => window.dispatchEvent(new Event('online')));
			await expect
				.poll(() => page.locator('li[data-status="sent"]').count(), { timeout: 20_000 })
				.toBe(3);
			const after = { pea: before.pea + 1, wheat: before.wheat + 1, trap: before.trap + 1 };
			expect(await now()).toEqual(after);

			// Sending again (a retry after a lost answer) stores nothing new.
			const items = await page.evaluate(async () => {
				return await new Promise<{ url: string; body: unknown }[]>((resolve, reject) => {
					const open = indexedDB.open('cornicle-offline');
					open.onerror = () => reject(open.error);
					open.onsuccess = () => {
						const req = open.result.transaction('outbox').objectStore('outbox').getAll();
						req.onsuccess = () =>
							resolve(
								req.result.map((i: { url: string; body: unknown }) => ({
									url: i.url,
									body: i.body
								}))
							);
					};
				});
			});
			expect(items).toHaveLength(3);
			for (const i of items) {
				const res = await page.request.post(i.url, { data: i.body, headers: { origin: APP } });
				expect(res.status(), i.url).toBe(200);
			}
			await page.getByRole('button', { name: 'Send now' }).click();
			await page.reload();
			await expect.poll(() => page.locator('li[data-status="sent"]').count()).toBe(3);
			expect(await now()).toEqual(after);
			await context.close();
		}
	);

	it(
		'signing out on a shared phone forgets the saved pages and the outbox, unsent records only if agreed',
		{ timeout: 120_000 },
		async () => {
			const context = await browser.newContext({ baseURL: APP, viewport: PHONE });
			const page = await context.newPage();
			await signInAs(page, 'scout');
			await page
				.getByTestId('offline-ready')
				.getByText('Saved on this phone')
				.waitFor({ timeout: 30_000 });
			// The visit cannot reach the server, so it waits in the outbox.
			await page.route('**/api/visits', (r) => r.abort());
			await quickVisit(page, ids['Pea Field'], /Next sweep/);
			const stored = () =>
				page.evaluate(async () => {
					const outbox = await new Promise<number>((resolve, reject) => {
						const open = indexedDB.open('cornicle-offline');
						open.onerror = () => reject(open.error);
						open.onsuccess = () => {
							const req = open.result.transaction('outbox').objectStore('outbox').count();
							req.onsuccess = () => resolve(req.result);
						};
					});
					return { outbox, pages: (await caches.keys()).includes('cornicle-pages-v1') };
				});
			expect(await stored()).toEqual({ outbox: 1, pages: true });

			const signOut = async (answer: 'accept' | 'dismiss') => {
				const asked = new Promise<string>((resolve) =>
					page.once('dialog', (d) => {
						resolve(d.message());
						void d[answer]();
					})
				);
				const button = page.getByRole('button', { name: 'Sign out' });
				if (!(await button.isVisible())) await page.getByRole('button', { name: 'Menu' }).click();
				await button.click();
				return asked;
			};
			// Staying keeps everything.
			expect(await signOut('dismiss')).toMatch(/^1 record is not sent yet/);
			expect(page.url()).toContain('/rounds');
			expect(await stored()).toEqual({ outbox: 1, pages: true });
			// Agreeing forgets it all, then signs out.
			await signOut('accept');
			await page.waitForURL(/\/signin/);
			expect(await stored()).toEqual({ outbox: 0, pages: false });
			await context.close();
		}
	);
});

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Recommendation } from '../../src/lib/server/db/models';
import { launch, newPage, PHONE } from '../helpers/browser';
import { closeTestDb } from '../helpers/db';
import { day, deskScenario } from '../helpers/advice';

let browser: Browser;
let s: Awaited<ReturnType<typeof deskScenario>>;
beforeAll(async () => {
	browser = await launch();
	s = await deskScenario();
});
afterAll(async () => {
	await browser?.close();
	await closeTestDb();
});

async function signIn(page: Page, email: string, password: string) {
	await page.goto('/signin');
	await page.getByLabel('E-mail address', { exact: true }).fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
}

describe('from the desk to the grower', () => {
	it('the agronomist issues a treat that trips the PHI and IRAC checks; the grower acknowledges', async () => {
		const { context, page } = await newPage(browser);
		await signIn(page, s.agronomist.user.email, s.agronomist.password);
		expect(new URL(page.url()).pathname).toBe('/desk');
		const first = page.locator('[data-testid="triage"] tbody tr').first();
		await expect(first.getAttribute('data-block')).resolves.toBe(String(s.hot.id));
		await first.getByRole('link', { name: s.hot.name }).click();
		await page.waitForURL(`**/blocks/${s.hot.id}`);
		await page.getByRole('img', { name: /Density over the season/ }).waitFor();
		await page.getByRole('link', { name: 'New recommendation' }).click();
		await page.waitForURL(`**/blocks/${s.hot.id}/recommend`);
		await page.getByRole('heading', { name: 'Before anyone sprays' }).waitFor();

		await page.getByLabel('Treat', { exact: true }).check();
		await page.getByLabel('Product (for a treat)').selectOption(String(s.products.sameGroup.id));
		await page.getByLabel('Planned treatment date').fill(day(1));
		await page.locator('[data-warning="phi-past-harvest"]').waitFor();
		await page.locator('[data-warning="irac-repeat"]').waitFor();
		// Issuing without weighing the warnings is refused with a message on the checkbox.
		await page.getByRole('button', { name: 'Issue to the grower' }).click();
		await page.getByText('tick the box to issue the recommendation with them').waitFor();
		expect(await Recommendation.count({ where: { blockId: s.hot.id, status: 'issued' } })).toBe(0);
		await page.getByLabel('I have weighed these warnings').check();
		await page.getByRole('button', { name: 'Issue to the grower' }).click();
		await page.waitForURL(`**/blocks/${s.hot.id}?issued=*`);
		const card = page.locator('article[data-status="issued"]');
		await card.locator('[data-warning="phi-past-harvest"]').waitFor();
		await card.locator('[data-warning="irac-repeat"]').waitFor();

		const rec = await Recommendation.findOne({ where: { blockId: s.hot.id, status: 'issued' } });
		expect(rec?.productId).toBe(s.products.sameGroup.id);
		expect(rec?.warnings.map((w) => w.code)).toEqual(
			expect.arrayContaining(['phi-past-harvest', 'irac-repeat', 'bloom-pollinators', 'rei'])
		);
		await context.close();

		const g = await newPage(browser, { viewport: PHONE });
		await signIn(g.page, s.grower.user.email, s.grower.password);
		expect(new URL(g.page.url()).pathname).toBe('/my-farms');
		await g.page.getByRole('heading', { name: 'Before anyone sprays' }).waitFor();
		const mine = g.page.locator(`article[data-status="issued"]`);
		await mine.getByText('Test bifenthrin').first().waitFor();
		await mine.getByRole('button', { name: 'I have read this' }).click();
		await g.page.locator('article[data-status="acknowledged"]').waitFor();
		const after = await Recommendation.findByPk(rec!.id);
		expect(after?.status).toBe('acknowledged');
		expect(after?.acknowledgedBy).toBe(s.grower.user.id);
		await g.context.close();
	});

	it('an empty recommendation form names the decision and saves nothing, with JavaScript off too', async () => {
		for (const javaScriptEnabled of [true, false]) {
			const { context, page } = await newPage(browser, { javaScriptEnabled });
			await signIn(page, s.agronomist.user.email, s.agronomist.password);
			const before = await Recommendation.count({ where: { blockId: s.mild.id } });
			await page.goto(`/blocks/${s.mild.id}/recommend`);
			await page.getByRole('button', { name: 'Issue to the grower' }).click();
			await page.getByText('Choose a decision.').waitFor();
			await page.getByLabel('Treat', { exact: true }).check();
			await page.getByRole('button', { name: 'Save as draft' }).click();
			await page.getByText('Choose a product for a treat recommendation.').waitFor();
			expect(await Recommendation.count({ where: { blockId: s.mild.id } })).toBe(before);
			await context.close();
		}
	});

	it("a grower opening another grower's block by URL gets a 404 page", async () => {
		const { context, page } = await newPage(browser);
		await signIn(page, s.grower.user.email, s.grower.password);
		const res = await page.goto(`/blocks/${s.other.id}`);
		expect(res?.status()).toBe(404);
		await context.close();
	});
});

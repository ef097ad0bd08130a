import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AS, call, waitForMail } from '../helpers/app';
import { launch, newPage, PHONE, signInAs } from '../helpers/browser';
import { buildOrganisation, buildUser, closeTestDb } from '../helpers/db';

let browser: Browser;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser?.close();
	await closeTestDb();
});

describe('sign-in', () => {
	const homes = [
		['admin', '/desk', /Desk/],
		['agronomist', '/desk', /Desk/],
		['scout', '/rounds', /round|today/i],
		['grower', '/my-farms', /farm/i],
		['regional', '/region', /Region|Valley/]
	] as const;
	for (const [who, home, heading] of homes) {
		it(`${who} lands on their own home`, async () => {
			const { context, page } = await newPage(browser, { viewport: PHONE });
			await signInAs(page, who);
			expect(new URL(page.url()).pathname).toBe(home);
			await expect(page.getByRole('heading', { level: 1 }).first().textContent()).resolves.toMatch(
				heading
			);
			await context.close();
		});
	}

	it('a scout gets 403 from agronomist and admin pages, with a page saying what to do', async () => {
		const { context, page } = await newPage(browser);
		await signInAs(page, 'scout');
		for (const path of ['/desk', '/admin/people']) {
			const res = await page.goto(path);
			expect(res?.status()).toBe(403);
			await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(
				'Not open to your role'
			);
		}
		await context.close();
	});

	it('a wrong password gets a clear message and no stack trace', async () => {
		const { context, page } = await newPage(browser);
		await page.goto('/signin');
		await page.getByLabel('E-mail address', { exact: true }).fill(AS.grower2);
		await page.getByLabel('Password').fill('not-the-password');
		await page.getByRole('button', { name: 'Sign in', exact: true }).click();
		await page.getByText('Wrong e-mail address or password.').waitFor();
		expect(await page.content()).not.toMatch(/at \w+ \(|node_modules|Error:/);
		await context.close();
	});

	it('a malformed form names the field, with JavaScript off too', async () => {
		for (const javaScriptEnabled of [true, false]) {
			const { context, page } = await newPage(browser, { javaScriptEnabled });
			await page.goto('/signin');
			await page.getByLabel('E-mail address', { exact: true }).fill('not-an-address');
			await page.getByRole('button', { name: 'Sign in', exact: true }).click();
			await page.getByText('Enter a valid e-mail address.').waitFor();
			await page.getByText('Enter your password.').waitFor();
			await context.close();
		}
	});

	it('repeated failures lock the account for a while (common practice: 5 tries in 15 min)', async () => {
		const org = await buildOrganisation();
		const { user, password } = await buildUser('scout', org.id);
		const attempt = (pw: string) =>
			call('/signin?/password', {
				form: { providerId: 'credentials', email: user.email, password: pw, redirectTo: '/' }
			});
		for (let i = 0; i < 5; i++) expect((await attempt('wrong')).status).toBe(400);
		const locked = await attempt(password);
		expect(locked.status).toBe(429);
		expect(await locked.text()).toContain('Too many failed attempts');
	});

	it('the sign-in link arrives in the fake inbox and signs the person in', async () => {
		const { context, page } = await newPage(browser, { viewport: PHONE });
		const sentAfter = Date.now();
		await page.goto('/signin');
		await page.getByLabel('E-mail address for the link').fill(AS.agronomist);
		await page.getByRole('button', { name: 'E-mail me a link' }).click();
		await page.waitForURL('**/signin/check-email**');
		const mail = await waitForMail(AS.agronomist, (m) =>
			m.text.includes('/auth/callback/nodemailer')
		);
		expect(mail.id).toBeGreaterThan(0);
		const link = mail.text.match(/https?:\/\/\S+\/auth\/callback\/nodemailer\S+/)?.[0];
		expect(link, `link in: ${mail.text}`).toBeTruthy();
		await page.goto(link!);
		await page.waitForURL('**/desk');
		expect(Date.now() - sentAfter).toBeLessThan(30_000);
		await context.close();
	});
});

// A grower sets up their own text alerts on a phone; an agronomist reads the alert log.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { Op } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	Farm,
	Notification,
	Organisation,
	Subscription,
	User
} from '../../src/lib/server/db/models';
import { AS } from '../helpers/app';
import { logRow } from '../helpers/alertLog';
import { DESKTOP, launch, newPage, PHONE, signInAs } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';

// Screens are kept for people to look at (not compared): .data/screens/alerts-*.png
const SHOTS = join(import.meta.dirname, '../../.data/screens');
let browser: Browser;
let harlan: User;
let before: { phone: string | null; subscriptions: number[] };
const made: number[] = [];

beforeAll(async () => {
	testDb();
	mkdirSync(SHOTS, { recursive: true });
	browser = await launch();
	harlan = (await User.findOne({ where: { email: AS.grower } }))!;
	const subs = await Subscription.findAll({ where: { userId: harlan.id } });
	before = { phone: harlan.phoneE164, subscriptions: subs.map((s) => s.id) };
});

afterAll(async () => {
	// Put the demo grower back as the seed left him, for the tests that follow.
	await Subscription.destroy({
		where: { userId: harlan.id, id: { [Op.notIn]: before.subscriptions } }
	});
	await harlan.reload();
	await harlan.update({ phoneE164: before.phone });
	if (made.length) await Notification.destroy({ where: { id: made } });
	await browser?.close();
	await closeTestDb();
});

describe('alerts settings and log', () => {
	it('a grower enters a national number and adds a text alert for one farm', async () => {
		const { context, page } = await newPage(browser, { viewport: PHONE });
		await signInAs(page, 'grower');
		await page.goto('/settings');
		await page.getByRole('heading', { name: 'My alerts', level: 1 }).waitFor();
		const phone = page.getByLabel('Mobile number for text messages');
		await phone.fill('701 555 0199');
		await page.getByRole('button', { name: 'Save addresses' }).click();
		await page.getByText('Saved where your alerts go.').waitFor();
		await expect(phone.inputValue()).resolves.toBe('(701) 555-0199');
		await harlan.reload();
		expect(harlan.phoneE164).toBe('+17015550199');

		// A bad number is refused with the field named, and the stored one stays.
		await phone.fill('555 01');
		await page.getByRole('button', { name: 'Save addresses' }).click();
		await page.getByText('Phone number is not a valid number in United States').waitFor();
		await harlan.reload();
		expect(harlan.phoneE164).toBe('+17015550199');

		await page.getByLabel('Text message', { exact: true }).check();
		await page
			.getByLabel('For', { exact: true })
			.selectOption({ label: 'Heronsbrook Farm (whole farm)' });
		await page.getByLabel('From level').selectOption('severe');
		await page.getByLabel('From', { exact: true }).fill('22:00');
		await page.getByLabel('Until').fill('06:00');
		await page.getByRole('button', { name: 'Add alert' }).click();
		await page.waitForURL('**/settings?saved=*');
		const item = page
			.getByRole('list', { name: 'Your alerts' })
			.getByRole('listitem')
			.filter({ hasText: 'Heronsbrook Farm (whole farm)' });
		await item.getByText('quiet 22:00 to 06:00').waitFor();
		await item.getByText('Severe').waitFor();
		const farm = await Farm.findOne({ where: { name: 'Heronsbrook Farm' } });
		const rows = await Subscription.findAll({
			where: { userId: harlan.id, farmId: farm!.id, channel: 'sms' }
		});
		expect(rows.map((r) => [r.minLevel, r.quietStart, r.quietEnd])).toEqual([
			['severe', '22:00', '06:00']
		]);
		// The page fits a phone: nothing wider than the screen.
		const width = await page.evaluate(() => document.documentElement.scrollWidth);
		expect(width).toBeLessThanOrEqual(PHONE.width);
		await context.close();
	});

	it('an agronomist opens the alert log and sees each message and its state', async () => {
		const org = await Organisation.findOne({ where: { slug: 'brackenridge' } });
		const june = await User.findOne({ where: { email: AS.grower2 } });
		const base = { organisationId: org!.id, userId: june!.id, toAddress: june!.phoneE164! };
		for (const r of [
			{ status: 'delivered', channel: 'sms' },
			{ status: 'failed', channel: 'sms', lastError: 'provider 21610: number replied STOP' },
			{ status: 'suppressed', channel: 'sms' },
			{ status: 'sent', channel: 'email', toAddress: june!.email }
		] as const)
			made.push((await logRow({ ...base, ...r })).id);

		const { context, page } = await newPage(browser, { viewport: DESKTOP });
		await signInAs(page, 'agronomist');
		await page.getByRole('link', { name: 'Alert log' }).first().click();
		await page.waitForURL('**/alerts');
		const table = page.getByTestId('alert-log');
		for (const id of made) await table.locator(`tr[data-id="${id}"]`).waitFor();
		const states = await Promise.all(
			made.map((id) => table.locator(`tr[data-id="${id}"] [data-status]`).textContent())
		);
		expect(states).toEqual(['Delivered', 'Gave up', 'Held back', 'Sent']);
		await table.getByText('provider 21610: number replied STOP').waitFor();

		await page.getByLabel('State').selectOption('failed');
		await page.getByRole('button', { name: 'Show' }).click();
		await page.waitForURL('**/alerts?status=failed*');
		await table.locator(`tr[data-id="${made[1]}"]`).waitFor();
		expect(await table.locator(`tr[data-id="${made[0]}"]`).count()).toBe(0);
		await context.close();
	});

	for (const [name, viewport] of [
		['phone', PHONE],
		['desktop', DESKTOP]
	] as const) {
		it(`both pages fit a ${name} (${viewport.width} px)`, async () => {
			for (const [who, path] of [
				['grower', '/settings'],
				['agronomist', '/alerts']
			] as const) {
				const { context, page } = await newPage(browser, { viewport });
				await signInAs(page, who);
				await page.goto(path);
				await page.getByRole('heading', { level: 1 }).waitFor();
				const width = await page.evaluate(() => document.documentElement.scrollWidth);
				expect(width, `${path} at ${viewport.width}`).toBeLessThanOrEqual(viewport.width);
				await page.screenshot({
					path: join(SHOTS, `alerts${path.replace('/', '-')}-${name}.png`),
					fullPage: true
				});
				await context.close();
			}
		});
	}
});

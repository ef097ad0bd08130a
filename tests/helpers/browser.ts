import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { APP, AS, DEMO_PASSWORD, type As } from './app';

const ARGS = [
	'--no-sandbox',
	'--disable-gpu',
	'--disable-quic',
	'--no-first-run',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync'
];

export const PHONE = { width: 360, height: 760 };
export const DESKTOP = { width: 1280, height: 800 };

/** Debian's Chromium through playwright-core (no browser download). */
export function launch(): Promise<Browser> {
	return chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ARGS });
}

export async function newPage(
	browser: Browser,
	opts: { viewport?: { width: number; height: number }; javaScriptEnabled?: boolean } = {}
): Promise<{ context: BrowserContext; page: Page }> {
	const context = await browser.newContext({
		baseURL: APP,
		viewport: opts.viewport ?? DESKTOP,
		javaScriptEnabled: opts.javaScriptEnabled ?? true
	});
	const page = await context.newPage();
	return { context, page };
}

/** Signs in through the sign-in page as a person would. */
export async function signInAs(page: Page, who: As, password = DEMO_PASSWORD) {
	await page.goto('/signin');
	await page.getByLabel('E-mail address', { exact: true }).fill(AS[who]);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in', exact: true }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
}

// Talking to the built app that `npm test` started (TEST_APP_URL), as a browser or API client would.
export const APP = process.env.TEST_APP_URL ?? 'http://127.0.0.1:3017';
export const INBOX = process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:8045';
export const DEMO_PASSWORD = 'cornicle-demo';

/** Demo sign-ins by role (see src/lib/server/db/seeders/demo-people.ts). */
export const AS = {
	admin: 'ines@brackenridge.test',
	agronomist: 'dana@brackenridge.test',
	scout: 'tomas@brackenridge.test',
	scout2: 'maeve@brackenridge.test',
	grower: 'harlan@heronsbrook.test',
	grower2: 'june@callowaybottoms.test',
	regional: 'sol@willowmere-extension.test',
	coopAgronomist: 'rafe@ostrander.test',
	coopScout: 'nell@ostrander.test',
	coopGrower: 'odile@braskfarm.test'
} as const;
export type As = keyof typeof AS;

const cookieJar = new Map<string, string>();

function cookiesFrom(res: Response) {
	return res.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.filter((c) => !c.endsWith('='))
		.join('; ');
}

/** Signs in through the sign-in form's action and returns the session cookie header. */
export async function signInCookie(email: string, password = DEMO_PASSWORD): Promise<string> {
	const key = `${email}\n${password}`;
	const cached = cookieJar.get(key);
	if (cached) return cached;
	const res = await fetch(`${APP}/signin?/password`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: APP, 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ providerId: 'credentials', email, password, redirectTo: '/' })
	});
	const cookie = cookiesFrom(res);
	if (!cookie.includes('session-token')) {
		throw new Error(`Sign-in as ${email} failed: ${res.status} ${await res.text()}`);
	}
	cookieJar.set(key, cookie);
	return cookie;
}

/** A request to the app as a demo role (or anonymous with `as: null`); never follows redirects. */
export async function call(
	path: string,
	opts: {
		as?: As | null;
		method?: string;
		json?: unknown;
		form?: Record<string, string>;
		headers?: Record<string, string>;
		body?: BodyInit;
	} = {}
): Promise<Response> {
	const headers: Record<string, string> = { origin: APP, ...opts.headers };
	if (opts.as) headers.cookie = await signInCookie(AS[opts.as]);
	let body = opts.body;
	if (opts.json !== undefined) {
		headers['content-type'] = 'application/json';
		body = JSON.stringify(opts.json);
	} else if (opts.form) {
		// As a browser without JavaScript posts a form (SvelteKit answers JSON to `*/*`).
		headers['content-type'] = 'application/x-www-form-urlencoded';
		headers.accept ??= 'text/html';
		body = new URLSearchParams(opts.form);
	}
	return fetch(`${APP}${path}`, {
		method: opts.method ?? (body ? 'POST' : 'GET'),
		headers,
		body,
		redirect: 'manual'
	});
}

interface InboxMail {
	id: number;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
}

/** Mail the fake inbox holds for an address, newest first. */
export async function mailTo(address: string): Promise<InboxMail[]> {
	const res = await fetch(`${INBOX}/api/messages?to=${encodeURIComponent(address)}`);
	return (await res.json()) as InboxMail[];
}

/** Polls the fake inbox until `pick` finds a message, or fails after `ms`. */
export async function waitForMail(address: string, pick: (m: InboxMail) => boolean, ms = 10_000) {
	const until = Date.now() + ms;
	for (;;) {
		const found = (await mailTo(address)).find(pick);
		if (found) return found;
		if (Date.now() > until) throw new Error(`No matching mail for ${address} within ${ms} ms`);
		await new Promise((r) => setTimeout(r, 200));
	}
}

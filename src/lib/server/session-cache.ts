import type { Cookies } from '@sveltejs/kit';

/**
 * Sessions already read from their cookie, by the cookie's exact value. Auth.js decrypts the
 * session token and encrypts a fresh one on every call (key derivation, AES and HMAC), which
 * cost more app CPU than filing a visit. A token read before is used again for up to a
 * minute (never past the session's end as Auth.js reports it); the next read after that goes
 * through Auth.js, which renews the cookie as usual (sessions last 12 hours). Sessions are signed cookies (nothing server-side to revoke), so a kept read
 * allows nothing the cookie itself would not: a changed or forged cookie is a different
 * key and goes through Auth.js.
 */
const KEEP_MS = 60_000;
const MAX_ENTRIES = 10_000;

interface Kept<U> {
	user: U;
	until: number;
}

export class SessionCache<U> {
	private kept = new Map<string, Kept<U>>();

	constructor(
		private keepMs = KEEP_MS,
		private maxEntries = MAX_ENTRIES
	) {}

	get(key: string, now = Date.now()): U | undefined {
		const k = this.kept.get(key);
		if (!k) return undefined;
		if (k.until <= now) {
			this.kept.delete(key);
			return undefined;
		}
		return k.user;
	}

	/** Keeps a signed-in user's session; `expires` is the session's own end. */
	set(key: string, user: U, expires: number, now = Date.now()) {
		const until = Math.min(now + this.keepMs, expires);
		if (until <= now) return;
		this.kept.delete(key);
		this.kept.set(key, { user, until });
		// Map keeps insertion order: the first entries are the oldest.
		while (this.kept.size > this.maxEntries) this.kept.delete(this.kept.keys().next().value!);
	}

	get size() {
		return this.kept.size;
	}
}

/** The session token as sent (Auth.js splits a large one over `name.0`, `name.1`, ...). */
export function sessionCookieValue(cookies: Cookies): string | null {
	const parts = cookies
		.getAll()
		.filter((c) => /^(__Secure-)?authjs\.session-token(\.\d+)?$/.test(c.name))
		.sort((a, b) => a.name.localeCompare(b.name, 'en', { numeric: true }));
	if (!parts.length) return null;
	return parts.map((c) => `${c.name}=${c.value}`).join(';');
}

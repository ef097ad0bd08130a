import { describe, expect, it } from 'vitest';
import { APP, AS, call, DEMO_PASSWORD } from '../helpers/app';

describe('security headers and cookies', () => {
	it('pages carry a content security policy and the usual headers', async () => {
		const res = await call('/signin');
		const csp = res.headers.get('content-security-policy') ?? '';
		expect(csp).toContain("default-src 'self'");
		expect(csp).toMatch(/script-src 'self'( 'nonce-[^']+'| 'sha256-[^']+')*/);
		expect(csp).toContain("frame-ancestors 'none'");
		expect(csp).toContain("object-src 'none'");
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
		expect(res.headers.get('x-frame-options')).toBe('DENY');
		expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
	});

	it('the session cookie is HttpOnly and SameSite=Lax', async () => {
		const res = await fetch(`${APP}/signin?/password`, {
			method: 'POST',
			redirect: 'manual',
			headers: {
				origin: APP,
				accept: 'text/html',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams({
				providerId: 'credentials',
				email: AS.regional,
				password: DEMO_PASSWORD,
				redirectTo: '/'
			})
		});
		const session = res.headers.getSetCookie().find((c) => c.includes('session-token='));
		expect(session, 'a session cookie').toBeTruthy();
		expect(session).toMatch(/HttpOnly/i);
		expect(session).toMatch(/SameSite=Lax/i);
		expect(session).toMatch(/Path=\//);
	});

	it('a form post from another origin is refused (SvelteKit origin check)', async () => {
		const res = await call('/signin?/password', {
			form: { providerId: 'credentials', email: AS.regional, password: DEMO_PASSWORD },
			headers: { origin: 'http://evil.example' }
		});
		expect(res.status).toBe(403);
	});
});

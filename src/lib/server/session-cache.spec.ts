import { describe, expect, it } from 'vitest';
import type { Cookies } from '@sveltejs/kit';
import { SessionCache, sessionCookieValue } from './session-cache';

const cookies = (list: Record<string, string>) =>
	({
		getAll: () => Object.entries(list).map(([name, value]) => ({ name, value }))
	}) as unknown as Cookies;

describe('session cache', () => {
	it('keeps a read for at most its keep time and never past the session’s expiry', () => {
		const c = new SessionCache<string>(60_000);
		c.set('a', 'dana', 1_000_000 + 10_000, 1_000_000);
		c.set('b', 'tomas', 1_000_000 + 3_600_000, 1_000_000);
		expect(c.get('a', 1_005_000)).toBe('dana');
		expect(c.get('a', 1_010_000)).toBeUndefined(); // the session itself ended
		expect(c.get('b', 1_059_999)).toBe('tomas');
		expect(c.get('b', 1_060_000)).toBeUndefined(); // kept a minute, then read again
	});

	it('does not keep an expired session and drops the oldest beyond its size', () => {
		const c = new SessionCache<number>(60_000, 3);
		c.set('old', 1, 999, 1_000);
		expect(c.size).toBe(0);
		for (let i = 0; i < 5; i++) c.set(`k${i}`, i, 1e12, 1_000);
		expect(c.size).toBe(3);
		expect(c.get('k0', 1_000)).toBeUndefined();
		expect(c.get('k4', 1_000)).toBe(4);
	});

	it('keys on every part of the session cookie and nothing else', () => {
		expect(sessionCookieValue(cookies({ other: 'x' }))).toBeNull();
		expect(sessionCookieValue(cookies({ 'authjs.session-token': 'abc', theme: 'dark' }))).toBe(
			'authjs.session-token=abc'
		);
		expect(
			sessionCookieValue(
				cookies({
					'__Secure-authjs.session-token.10': 'c',
					'__Secure-authjs.session-token.2': 'b',
					'__Secure-authjs.session-token.0': 'a'
				})
			)
		).toBe(
			'__Secure-authjs.session-token.0=a;__Secure-authjs.session-token.2=b;__Secure-authjs.session-token.10=c'
		);
		expect(sessionCookieValue(cookies({ 'authjs.session-token-evil': 'x' }))).toBeNull();
	});
});

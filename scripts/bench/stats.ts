/** Percentile of an array of numbers (nearest-rank on a sorted copy). */
export function percentile(values: number[], p: number): number {
	if (!values.length) return NaN;
	const s = [...values].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1))];
}

export const ms = (n: number) => `${n.toFixed(1)} ms`;

/** Signs in through the sign-in form action and returns the session cookie header. */
export async function signIn(app: string, email: string, password = 'cornicle-demo') {
	const res = await fetch(`${app}/signin?/password`, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: app,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded'
		},
		body: new URLSearchParams({ providerId: 'credentials', email, password, redirectTo: '/' })
	});
	const cookie = res.headers
		.getSetCookie()
		.map((c) => c.split(';')[0])
		.filter((c) => !c.endsWith('='))
		.join('; ');
	if (!cookie.includes('session-token'))
		throw new Error(`sign-in as ${email} failed (${res.status})`);
	return cookie;
}

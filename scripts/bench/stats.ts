import { readFileSync } from 'node:fs';

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

/** The machine's CPU counters (Linux /proc/stat, all CPUs), in clock ticks. */
export function cpuTicks(): { total: number; steal: number } | null {
	try {
		const [, ...f] = readFileSync('/proc/stat', 'utf8').split('\n')[0].trim().split(/\s+/);
		const n = f.map(Number);
		// user nice system idle iowait irq softirq steal (guest time is already in user)
		return { total: n.slice(0, 8).reduce((a, b) => a + b, 0), steal: n[7] ?? 0 };
	} catch {
		return null;
	}
}

/**
 * Share of the machine's CPU time the hypervisor gave to other guests (steal) between two
 * readings of `cpuTicks`, in percent; null where /proc/stat is not there.
 */
export function stealBetween(
	a: ReturnType<typeof cpuTicks>,
	b: ReturnType<typeof cpuTicks>
): number | null {
	if (!a || !b || b.total <= a.total) return null;
	return (100 * (b.steal - a.steal)) / (b.total - a.total);
}

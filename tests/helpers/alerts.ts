// Helpers for the alerts tests: a small world of people with subscriptions, real engine
// assessments at each level, and the SMS fake's control API.
import { randomInt } from 'node:crypto';
import { assessBlock, type Assessment, type LevelKey } from '../../src/lib/engine';
import { plantVisit, soybeanBlock } from '../../src/lib/engine/fixtures';
import { Subscription, User } from '../../src/lib/server/db/models';
import { buildBlock, buildFarm, buildOrganisation, buildUser } from './db';
import { soyIds } from './advice';

export const SMS_FAKE = process.env.TWILIO_BASE_URL ?? 'http://127.0.0.1:8056';

/** An invented North Dakota-style number, unique enough for one test run. */
export const phone = () => `+1701${randomInt(2_000_000, 9_999_999)}`;

// Counts (per plant, two visits 4 days apart) that the engine rates at each level; invented.
const COUNTS: Record<Exclude<LevelKey, 'calm'>, [number, number]> = {
	stirring: [100, 200],
	action: [250, 260],
	severe: [300, 700]
};

/** A real engine assessment at the given level (soybean aphid library thresholds). */
export function assessmentAt(level: Exclude<LevelKey, 'calm'>): Assessment {
	const [a, b] = COUNTS[level];
	const r = assessBlock(soybeanBlock([plantVisit('2025-07-01', a), plantVisit('2025-07-05', b)]));
	if (r.level !== level) throw new Error(`fixture for ${level} assessed as ${r.level}`);
	return r;
}

/** An organisation with a grower's farm and block, an agronomist and a scout, all with phones. */
export async function alertWorld(opts: { timezone?: string } = {}) {
	const org = await buildOrganisation({ timezone: opts.timezone ?? 'UTC' });
	const grower = (await buildUser('grower', org.id)).user;
	const agronomist = (await buildUser('agronomist', org.id)).user;
	const scout = (await buildUser('scout', org.id)).user;
	for (const u of [grower, agronomist, scout]) await u.update({ phoneE164: phone() });
	const farm = await buildFarm(org.id, grower.id);
	const block = await buildBlock(farm, await soyIds(), { currentLevel: 'calm' });
	return { org, grower, agronomist, scout, farm, block };
}

export async function subscribe(
	user: User,
	channel: 'sms' | 'email',
	over: Partial<
		Pick<Subscription, 'minLevel' | 'farmId' | 'blockId' | 'quietStart' | 'quietEnd' | 'active'>
	> = {}
) {
	return Subscription.create({ userId: user.id, channel, minLevel: 'action', ...over });
}

export interface FakeSms {
	sid: string;
	direction: 'outbound-api' | 'outbound-reply' | 'inbound';
	to: string;
	from: string;
	body: string;
	status: string;
}

/** Every message the fake holds to or from a number, newest first. */
export async function smsFor(number: string, base = SMS_FAKE): Promise<FakeSms[]> {
	const res = await fetch(`${base}/_fake/messages?number=${encodeURIComponent(number)}`);
	return (await res.json()) as FakeSms[];
}

/** Has the fake deliver a text from `from` to the app's inbound webhook; returns the replies. */
export async function textIn(from: string, body: string, base = SMS_FAKE) {
	const res = await fetch(`${base}/_fake/inbound`, {
		method: 'POST',
		body: JSON.stringify({ from, body })
	});
	return (await res.json()) as { status: number; replies: string[] };
}

/** Polls `check` until it returns a truthy value, or fails after `ms`. */
export async function eventually<T>(
	check: () => Promise<T>,
	ms = 15_000,
	what = 'condition'
): Promise<NonNullable<T>> {
	const until = Date.now() + ms;
	for (;;) {
		const v = await check();
		if (v) return v as NonNullable<T>;
		if (Date.now() > until) throw new Error(`Timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 150));
	}
}

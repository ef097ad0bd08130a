import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ENDPOINTS, PUBLIC } from '../access';
import { APP, call, type As } from '../helpers/app';
import { actionUrl, formActions } from '../helpers/actions';
import { closeTestDb, testDb } from '../helpers/db';
import { demoIds, fill } from '../helpers/fixtures';
import { formBody, jsonBody, RAW_BODIES } from './payloads';

// Property-based bad input over every JSON endpoint that writes and every form action.
// The figures: payloads tried, server errors (must be 0), rows changed by refused requests
// (must be 0). Runs alone (the "hardening" project runs after the others).
const JSON_RUNS = Number(process.env.FUZZ_JSON_RUNS ?? 700);
const FORM_RUNS = Number(process.env.FUZZ_FORM_RUNS ?? 220);
const CONCURRENCY = 12;

const TABLES = [
	'organisations',
	'users',
	'memberships',
	'farms',
	'blocks',
	'scouting_assignments',
	'visits',
	'visit_counts',
	'traps',
	'trap_readings',
	'photos',
	'weather_days',
	'assessments',
	'products',
	'recommendations',
	'threshold_rules',
	'subscriptions',
	'notifications',
	'sms_opt_outs'
];

async function rowCounts(): Promise<Record<string, number>> {
	const sql = `SELECT ${TABLES.map((t) => `(SELECT COUNT(*) FROM \`${t}\`) AS \`${t}\``).join(', ')}`;
	const [row] = await testDb().query<Record<string, number>>(sql, { type: QueryTypes.SELECT });
	return Object.fromEntries(Object.entries(row).map(([k, v]) => [k, Number(v)]));
}

function changed(a: Record<string, number>, b: Record<string, number>) {
	return Object.keys(a).reduce((n, k) => n + Math.abs(b[k] - a[k]), 0);
}

interface Tally {
	payloads: number;
	serverErrors: { target: string; status: number; sample: string }[];
	accepted: number;
	resets: number;
}

/** A kept-alive socket the server has closed fails once; ask a few times before calling it down. */
async function appIsUp() {
	for (let i = 0; i < 5; i++) {
		if (
			await fetch(`${APP}/api/health`).then(
				(r) => r.ok,
				() => false
			)
		)
			return true;
		await new Promise((r) => setTimeout(r, 300));
	}
	return false;
}

async function pool<T>(items: T[], fn: (item: T) => Promise<void>) {
	let next = 0;
	await Promise.all(
		Array.from({ length: CONCURRENCY }, async () => {
			while (next < items.length) await fn(items[next++]);
		})
	);
}

const ROLE_FOR: Record<string, As> = {
	admin: 'admin',
	agronomist: 'agronomist',
	scout: 'scout',
	grower: 'grower',
	regional: 'regional'
};

let ids: Record<string, string> = {};
const totals = { payloads: 0, serverErrors: 0, refusedRowChanges: 0, accepted: 0 };

beforeAll(async () => {
	ids = await demoIds();
});
afterAll(async () => {
	console.log(
		`Fuzz: ${totals.payloads} payloads; server errors: ${totals.serverErrors}; rows changed by refused requests: ${totals.refusedRowChanges}; accepted (valid by chance): ${totals.accepted}`
	);
	await closeTestDb();
});

async function fuzzTarget(
	label: string,
	send: (i: number) => Promise<Response>,
	count: number
): Promise<Tally> {
	const tally: Tally = { payloads: 0, serverErrors: [], accepted: 0, resets: 0 };
	const before = await rowCounts();
	await pool(
		Array.from({ length: count }, (_, i) => i),
		async (i) => {
			let res: Response;
			try {
				res = await send(i);
				await res.arrayBuffer();
			} catch (e) {
				// A server that answers before reading a large body closes the socket under the
				// client; that is a refusal, not a crash, as long as the app is still up.
				const up = await appIsUp();
				if (!up) throw new Error(`${label}: the app went down on payload ${i}: ${e}`);
				tally.payloads++;
				tally.resets++;
				return;
			}
			tally.payloads++;
			if (res.status >= 500)
				tally.serverErrors.push({ target: label, status: res.status, sample: String(i) });
			else if (res.status < 400) tally.accepted++;
		}
	);
	const delta = changed(before, await rowCounts());
	totals.payloads += tally.payloads;
	totals.serverErrors += tally.serverErrors.length;
	totals.accepted += tally.accepted;
	if (tally.accepted === 0) totals.refusedRowChanges += delta;
	expect(tally.serverErrors, `${label}: server errors`).toEqual([]);
	if (tally.accepted === 0) expect(delta, `${label}: rows changed by refused requests`).toBe(0);
	return tally;
}

const actions = (await formActions()).filter((a) => !a.startsWith('/signout'));

describe('bad input never causes a server error or a partial write', () => {
	const writes = Object.entries(ENDPOINTS).filter(([k]) => !k.startsWith('GET '));
	const webhooks = Object.keys(PUBLIC).filter((k) => /^(POST|PUT|PATCH) /.test(k));

	for (const [key, rule] of writes) {
		it(`JSON endpoint ${key}`, async () => {
			const [method, id] = key.split(' ');
			const path = fill(rule.path ?? id.replace(/\/\([^)]+\)/g, ''), ids);
			const as = ROLE_FOR[rule.roles[0]];
			const bodies = fc.sample(jsonBody, { numRuns: JSON_RUNS, seed: 42 });
			await fuzzTarget(
				key,
				(i) =>
					i < RAW_BODIES.length
						? call(path, {
								as,
								method,
								body: RAW_BODIES[i].body,
								headers: { 'content-type': RAW_BODIES[i].type }
							})
						: call(path, { as, method, json: bodies[i - RAW_BODIES.length] }),
				JSON_RUNS + RAW_BODIES.length
			);
		});
	}

	for (const key of webhooks) {
		it(`webhook ${key}`, async () => {
			const [method, path] = key.split(' ');
			const forms = fc.sample(formBody, { numRuns: FORM_RUNS, seed: 7 });
			await fuzzTarget(key, (i) => call(path, { as: null, method, form: forms[i] }), FORM_RUNS);
		});
	}

	// One test per action, so each keeps its own time limit however many actions there are.
	const roles: As[] = ['agronomist', 'scout', 'grower', 'admin'];
	it('finds the form actions', () => expect(actions.length).toBeGreaterThan(5));
	for (const key of actions) {
		it(`form action ${key}`, async () => {
			const url = actionUrl(key, (p) => fill(p.replace(/\[id\]/g, '{block}'), ids));
			const forms = fc.sample(formBody, { numRuns: FORM_RUNS, seed: 11 });
			await fuzzTarget(
				key,
				(i) =>
					i % 10 === 9
						? call(url, {
								as: roles[i % roles.length],
								body: RAW_BODIES[i % RAW_BODIES.length].body,
								headers: {
									'content-type': RAW_BODIES[i % RAW_BODIES.length].type,
									accept: 'text/html'
								}
							})
						: call(url, {
								as: key.startsWith('/signin') ? null : roles[i % roles.length],
								form: forms[i]
							}),
				FORM_RUNS
			);
		});
	}

	it('tried at least 10,000 payloads in all', () => {
		expect(totals.payloads).toBeGreaterThanOrEqual(10_000);
		expect(totals.serverErrors).toBe(0);
		expect(totals.refusedRowChanges).toBe(0);
	});
});

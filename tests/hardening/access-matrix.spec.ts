import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	ACTIONS,
	ALL_ROLES,
	ENDPOINTS,
	PAGES,
	PUBLIC,
	PUBLIC_ACTIONS,
	type AccessRule
} from '../access';
import { call, type As } from '../helpers/app';
import { formActions } from '../helpers/actions';
import { closeTestDb, testDb } from '../helpers/db';
import { demoIds, fill } from '../helpers/fixtures';
import { endpointRoutes, pageRoutes, urlFor } from '../helpers/routes';
import type { Role } from '../../src/lib/roles';

// Every page, action and endpoint, tried anonymously, as each of the five roles, and against
// another organisation's (or another grower's) records, checked against tests/access.ts.
// Figure: probes run, unexpected allows (must be 0).
const ACCOUNT: Record<Role, As> = {
	admin: 'admin',
	agronomist: 'agronomist',
	scout: 'scout',
	grower: 'grower',
	regional: 'regional'
};
/** The same kind of record, in another organisation (or on another grower's farm). */
const FOREIGN: Record<string, string> = {
	block: 'coopBlock',
	trap: 'coopTrap',
	visit: 'coopVisit'
};

let ids: Record<string, string> = {};
let probes = 0;
const unexpected: string[] = [];

async function tables() {
	const [row] = await testDb().query<Record<string, number>>(
		`SELECT (SELECT COUNT(*) FROM visits) v, (SELECT COUNT(*) FROM recommendations) r,
		        (SELECT COUNT(*) FROM products) p, (SELECT COUNT(*) FROM threshold_rules) t,
		        (SELECT COUNT(*) FROM scouting_assignments) a, (SELECT COUNT(*) FROM traps) tr,
		        (SELECT COUNT(*) FROM weather_days) w, (SELECT SUM(status = 'acknowledged') FROM recommendations) ack`,
		{ type: QueryTypes.SELECT }
	);
	return row;
}

const refused = (res: Response) =>
	res.status === 401 ||
	res.status === 403 ||
	res.status === 404 ||
	(res.status === 303 && (res.headers.get('location') ?? '').startsWith('/signin'));

async function probe(
	label: string,
	path: string,
	opts: Parameters<typeof call>[1],
	expectAllow: boolean
) {
	const res = await call(path, opts);
	await res.arrayBuffer();
	probes++;
	if (expectAllow) {
		if (res.status >= 500) unexpected.push(`${label}: ${res.status} for an allowed caller`);
	} else if (!refused(res)) {
		unexpected.push(`${label}: ${res.status} ${res.headers.get('location') ?? ''}`);
	}
	return res;
}

function foreignPath(path: string, role: Role) {
	// Only records with a known counterpart elsewhere (photos have none in the demo).
	const keys = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
	if (!keys.length || !keys.every((k) => FOREIGN[k])) return null;
	return path.replace(/\{(\w+)\}/g, (_, k: string) =>
		role === 'grower' && k === 'block' ? '{otherGrowerBlock}' : `{${FOREIGN[k] ?? k}}`
	);
}

beforeAll(async () => {
	ids = await demoIds();
});
afterAll(async () => {
	console.log(`Access matrix: ${probes} probes, unexpected allows: ${unexpected.length}`);
	for (const u of unexpected) console.log(`  unexpected: ${u}`);
	await closeTestDb();
});

async function checkRule(
	kind: string,
	key: string,
	rule: AccessRule,
	method: string,
	path: string
) {
	const anon = await probe(
		`${kind} ${key} as anonymous`,
		fill(path, ids),
		{ as: null, method, form: method === 'POST' && kind === 'action' ? {} : undefined },
		false
	);
	expect(anon.status).toBeLessThan(500);
	for (const role of ALL_ROLES) {
		const mine = rule.roles.includes(role);
		const write = method !== 'GET';
		// Allowed writes are exercised by each feature's own tests; here only refusals are posted.
		if (!(mine && write)) {
			await probe(
				`${kind} ${key} as ${role}`,
				fill(path, ids),
				{
					as: ACCOUNT[role],
					method,
					form: write && kind === 'action' ? {} : undefined,
					json: write && kind !== 'action' ? {} : undefined
				},
				mine
			);
		}
		const foreign = mine ? foreignPath(path, role) : null;
		if (foreign) {
			await probe(
				`${kind} ${key} as ${role} on another's record`,
				fill(foreign, ids),
				{
					as: ACCOUNT[role],
					method,
					form: write && kind === 'action' ? {} : undefined,
					json: write && kind !== 'action' ? {} : undefined
				},
				false
			);
		}
	}
}

describe('access matrix', () => {
	it('has an expected answer for every page, action and endpoint', async () => {
		expect(pageRoutes().filter((id) => !PAGES[id] && !PUBLIC[id])).toEqual([]);
		expect(endpointRoutes().filter((k) => !ENDPOINTS[k] && !PUBLIC[k])).toEqual([]);
		const actions = await formActions();
		const missing = actions.filter((a) => !ACTIONS[a] && !PUBLIC_ACTIONS.includes(a));
		if (missing.length)
			console.log(`Actions with no entry in tests/access.ts: ${missing.join(', ')}`);
		expect(missing).toEqual([]);
	});

	it('refuses everyone the table does not allow, and changes nothing', async () => {
		const before = await tables();
		for (const [id, rule] of Object.entries(PAGES))
			await checkRule('page', id, rule, 'GET', rule.path ?? urlFor(id));
		for (const [key, rule] of Object.entries(ENDPOINTS)) {
			const [method, id] = key.split(' ');
			await checkRule('endpoint', key, rule, method, rule.path ?? urlFor(id));
		}
		for (const [key, rule] of Object.entries(ACTIONS)) {
			const [id, name] = key.split(' ?/');
			const base = rule.path ?? urlFor(id);
			await checkRule('action', key, rule, 'POST', name === 'default' ? base : `${base}?/${name}`);
		}
		expect(unexpected).toEqual([]);
		expect(await tables()).toEqual(before);
		expect(probes).toBeGreaterThan(200);
	});
});

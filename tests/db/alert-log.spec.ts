// The alert log's one query per page, against an organisation with 300,000 messages: every
// filter reads an index range in order (no filesort), keyset pages meet without gaps or
// repeats, and a page stays fast however deep it is. Figures: milliseconds per page.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alertLog, LOG_PAGE, zonedMidnight } from '../../src/lib/server/queries/alertLog';
import type { AlertLogQuery } from '../../src/lib/schemas/alerts';
import { buildOrganisation, buildUser, closeTestDb, testDb } from '../helpers/db';

const ROWS = 300_000;
let org: number;
let small: number;

afterAll(async () => {
	// The later suites share this database; the alert workers there should not wade through these.
	const t0 = performance.now();
	await testDb().query('DELETE FROM notifications WHERE organisation_id IN (:orgs)', {
		replacements: { orgs: [org, small] }
	});
	console.log(`Alert log: removed the bulk rows in ${(performance.now() - t0).toFixed(0)} ms`);
	await closeTestDb();
}, 120_000);

beforeAll(async () => {
	org = (await buildOrganisation()).id;
	const user = (await buildUser('grower', org)).user.id;
	// MariaDB's Sequence engine (seq_1_to_N) makes the rows in one statement: one message every
	// 20 s going back ~70 days, states and kinds spread over the rows.
	const t0 = performance.now();
	await testDb().query(
		`INSERT INTO notifications (organisation_id, user_id, channel, kind, dedupe_key, to_address,
		   body_text, status, attempts, not_before, created_at, updated_at)
		 SELECT :org, :user, IF(seq % 2, 'sms', 'email'),
		        ELT(1 + seq % 6, 'level-action', 'level-severe', 'level-stirring', 'recommendation', 'digest', 'level-calm'),
		        CONCAT('bulk-log:', :org, ':', seq), '+17015550100', 'x',
		        ELT(1 + seq % 10, 'delivered', 'delivered', 'delivered', 'delivered', 'sent', 'sent', 'failed', 'undelivered', 'suppressed', 'pending'),
		        1, NOW() + INTERVAL 1 DAY,
		        NOW() - INTERVAL (seq * 20) SECOND, NOW() - INTERVAL (seq * 20) SECOND
		   FROM seq_1_to_${ROWS}`,
		{ replacements: { org, user } }
	);
	console.log(`Alert log: ${ROWS} rows inserted in ${(performance.now() - t0).toFixed(0)} ms`);
	small = (await buildOrganisation()).id;
	const u2 = (await buildUser('grower', small)).user.id;
	// 130 rows sharing a few creation seconds, so paging must break ties on the id.
	await testDb().query(
		`INSERT INTO notifications (organisation_id, user_id, channel, kind, dedupe_key, to_address,
		   body_text, status, attempts, not_before, created_at, updated_at)
		 SELECT :org, :user, 'sms', 'level-action', CONCAT('tie-log:', :org, ':', seq), '+17015550100', 'x',
		        'delivered', 1, NOW(), '2026-06-01 12:00:00' - INTERVAL (seq DIV 40) SECOND, NOW()
		   FROM seq_1_to_130`,
		{ replacements: { org: small, user: u2 } }
	);
}, 300_000);

async function explain(q: AlertLogQuery) {
	const sql: string[] = [];
	const sequelize = testDb();
	// Sequelize reads its logging option on every query, so it records the statement sent.
	const opts = (sequelize as unknown as { options: { logging: unknown } }).options;
	const log = opts.logging;
	opts.logging = (s: string) => sql.push(s.replace(/^Executing \([^)]*\): /, ''));
	try {
		await alertLog(org, q, 'America/Chicago');
	} finally {
		opts.logging = log;
	}
	expect(sql).toHaveLength(1);
	return sequelize.query<{ key: string | null; type: string; Extra: string; rows: number }>(
		`EXPLAIN ${sql[0]}`,
		{
			type: QueryTypes.SELECT
		}
	);
}

describe('alert log query', () => {
	const filters: [string, AlertLogQuery][] = [
		['no filter', {}],
		['status', { status: 'failed' }],
		['kind', { kind: 'digest' }],
		['channel', { channel: 'sms' }],
		['status + channel + dates', { status: 'delivered', channel: 'email', from: '2026-01-01' }]
	];
	for (const [label, q] of filters) {
		it(`${label}: one indexed query, no filesort, first and deep pages fast`, async () => {
			const [n] = await explain(q);
			expect(n.key, JSON.stringify(n)).toMatch(/organisation_id|notifications_org/);
			expect(n.Extra).not.toMatch(/filesort/);
			const deepQ = { ...q, older: `${Math.floor(Date.now() / 1000) - 40 * 86_400}-999999999` };
			const [d] = await explain(deepQ);
			expect(d.type, JSON.stringify(d)).toBe('range');
			expect(d.Extra).not.toMatch(/filesort/);
			const t0 = performance.now();
			const first = await alertLog(org, q, 'America/Chicago');
			const t1 = performance.now();
			expect(first.rows).toHaveLength(LOG_PAGE);
			// 2,000 pages deep by cursor costs the same as the first page.
			const deep = await alertLog(org, deepQ, 'America/Chicago');
			const t2 = performance.now();
			expect(deep.rows.length).toBeGreaterThan(0);
			console.log(
				`Alert log ${label}: first page ${(t1 - t0).toFixed(1)} ms, deep page ${(t2 - t1).toFixed(1)} ms over ${ROWS} rows`
			);
			expect(t1 - t0).toBeLessThan(250);
			expect(t2 - t1).toBeLessThan(250);
		});
	}

	it('pages older and newer meet exactly, ties broken by id', async () => {
		const all = (
			await testDb().query<{ id: number }>(
				'SELECT id FROM notifications WHERE organisation_id = ? ORDER BY created_at DESC, id DESC',
				{ replacements: [small], type: QueryTypes.SELECT }
			)
		).map((r) => Number(r.id));
		expect(all).toHaveLength(130);
		const seen: number[] = [];
		const cursors: (string | undefined)[] = [];
		let older: string | undefined;
		for (;;) {
			const p = await alertLog(small, { older }, 'UTC');
			cursors.push(older);
			seen.push(...p.rows.map((r) => Number(r.id)));
			if (!p.older) break;
			older = p.older;
		}
		expect(seen).toEqual(all);
		// Back up from the last page with the newer cursor: the same second-to-last page.
		const last = await alertLog(small, { older: cursors[cursors.length - 1] }, 'UTC');
		const back = await alertLog(small, { newer: last.newer! }, 'UTC');
		expect(back.rows.map((r) => Number(r.id))).toEqual(all.slice(LOG_PAGE, 2 * LOG_PAGE));
	});

	it('date filters are local days in the organisation zone', () => {
		// America/Chicago is UTC-5 in June (CDT) and UTC-6 in January (CST), from memory.
		expect(zonedMidnight('2026-06-01', 'America/Chicago').toISOString()).toBe(
			'2026-06-01T05:00:00.000Z'
		);
		expect(zonedMidnight('2026-01-15', 'America/Chicago').toISOString()).toBe(
			'2026-01-15T06:00:00.000Z'
		);
		expect(zonedMidnight('2026-03-08', 'UTC').toISOString()).toBe('2026-03-08T00:00:00.000Z');
	});
});

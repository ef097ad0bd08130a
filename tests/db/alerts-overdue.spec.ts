// The scouting-overdue alert: outbox rows for blocks past their re-scout, once per block and
// due date, in one transaction, to the assigned scouts and the agronomists (never growers).
import { randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { isoPlusDays } from '../../src/lib/engine';
import { queueOverdueAlerts } from '../../src/lib/server/alerts/overdueAlerts';
import { currentSettings } from '../../src/lib/server/alerts/settings';
import { Notification, Recommendation, ScoutingAssignment } from '../../src/lib/server/db/models';
import { alertWorld, subscribe } from '../helpers/alerts';
import { soyIds } from '../helpers/advice';
import { buildBlock, buildUser, closeTestDb, testDb } from '../helpers/db';

afterAll(closeTestDb);

const DAY = 86_400_000;
const rowsFor = (blockId: number) =>
	Notification.findAll({ where: { blockId, kind: 'scouting-overdue' }, order: [['id', 'ASC']] });
const who = (rows: Notification[]) => rows.map((r) => `${r.userId}:${r.channel}`).sort();
const sweep = (orgId: number, now = new Date()) =>
	queueOverdueAlerts(testDb(), currentSettings(), now, orgId);

describe('scouting overdue alerts', () => {
	it('go once per block and due date to the scout and agronomists, never the grower', async () => {
		const now = new Date();
		const today = now.toISOString().slice(0, 10); // the organisation keeps UTC
		const w = await alertWorld();
		// Re-scout every 7 days (the block's default), last visit 10 days ago: due 3 days ago.
		await w.block.update({ lastVisitOn: isoPlusDays(today, -10), currentLevel: 'action' });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id, intervalDays: 7 });
		await subscribe(w.scout, 'sms', { minLevel: 'severe' }); // scouts hear at any level
		await subscribe(w.scout, 'email');
		await subscribe(w.agronomist, 'email', { minLevel: 'action' });
		await subscribe(w.agronomist, 'sms', { minLevel: 'severe' }); // above the block's level
		await subscribe(w.grower, 'sms', { minLevel: 'calm' });
		await subscribe(w.grower, 'email', { minLevel: 'calm' });

		expect(await sweep(w.org.id, now)).toBe(3);
		const rows = await rowsFor(w.block.id);
		expect(who(rows)).toEqual(
			[`${w.scout.id}:sms`, `${w.scout.id}:email`, `${w.agronomist.id}:email`].sort()
		);
		const due = isoPlusDays(today, -3);
		for (const r of rows) expect(r.dedupeKey).toContain(`overdue:b${w.block.id}:${due}:`);
		const sms = rows.find((r) => r.channel === 'sms')!;
		expect(sms.toAddress).toBe(w.scout.phoneE164);
		expect(sms.bodyText).toContain(w.block.name);
		expect(sms.bodyText).toContain(`due ${due}`);
		expect(sms.bodyText).toMatch(/\/rounds$/); // a scout's link is the rounds
		expect(sms.bodyText.length).toBeLessThanOrEqual(160); // one GSM-7 segment (common practice)
		const mail = rows.find((r) => r.userId === w.agronomist.id)!;
		expect(mail.bodyText).toContain('Days overdue: 3');
		expect(mail.bodyText).toContain(`/blocks/${w.block.id}`);
		expect(mail.bodyHtml).toContain('<table');

		// The same due date never queues again: at once, nor days later outside the repeat window.
		expect(await sweep(w.org.id, now)).toBe(0);
		expect(await sweep(w.org.id, new Date(now.getTime() + 3 * DAY))).toBe(0);
		expect(await rowsFor(w.block.id)).toHaveLength(3);

		// A visit today clears it; the next lapse (due in 7 days) is a new due date.
		await w.block.update({ lastVisitOn: today });
		expect(await sweep(w.org.id, new Date(now.getTime() + 7 * DAY))).toBe(0);
		expect(await sweep(w.org.id, new Date(now.getTime() + 9 * DAY))).toBe(3);
		const later = await rowsFor(w.block.id);
		expect(later).toHaveLength(6);
		expect(later.slice(3).every((r) => r.dedupeKey.includes(`:${isoPlusDays(today, 7)}:`))).toBe(
			true
		);
	});

	it("count each row once when two sweeps race (INSERT IGNORE skips the loser's rows)", async () => {
		const now = new Date();
		const today = now.toISOString().slice(0, 10);
		const w = await alertWorld();
		await w.block.update({ lastVisitOn: isoPlusDays(today, -10), currentLevel: 'action' });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id, intervalDays: 7 });
		await subscribe(w.scout, 'sms', { minLevel: 'severe' });
		await subscribe(w.scout, 'email');
		await subscribe(w.agronomist, 'email', { minLevel: 'action' });

		const counts = await Promise.all([sweep(w.org.id, now), sweep(w.org.id, now)]);
		expect(await rowsFor(w.block.id)).toHaveLength(3);
		expect(counts[0] + counts[1]).toBe(3);
	});

	it("follows each scout's own interval and open follow-up dates, as the rounds and desk do", async () => {
		const today = new Date().toISOString().slice(0, 10);
		const w = await alertWorld();
		// Five days since the visit: within the block's 7 days, past this scout's 3.
		await w.block.update({ lastVisitOn: isoPlusDays(today, -5), currentLevel: 'calm' });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id, intervalDays: 3 });
		await subscribe(w.scout, 'email');
		await subscribe(w.agronomist, 'email', { minLevel: 'calm' });
		// A second block seen 2 days ago, with a follow-up visit asked for by yesterday.
		const b2 = await buildBlock(w.farm, await soyIds(), {
			currentLevel: 'stirring',
			lastVisitOn: isoPlusDays(today, -2)
		});
		await Recommendation.create({
			organisationId: w.org.id,
			blockId: b2.id,
			authorId: w.agronomist.id,
			decision: 'rescout',
			rescoutBy: isoPlusDays(today, -1),
			followUpDue: isoPlusDays(today, -1),
			warnings: [],
			status: 'issued',
			issuedAt: new Date()
		});
		expect(await sweep(w.org.id)).toBe(2);
		const [first] = await rowsFor(w.block.id);
		expect(first.userId).toBe(w.scout.id);
		expect(first.bodyText).toContain('Days overdue: 2');
		expect(first.bodyText).toContain('Re-scout interval: every 3 days');
		const [second] = await rowsFor(b2.id);
		expect(second.userId).toBe(w.agronomist.id);
		expect(second.bodyText).toContain(`Follow-up visit asked for by: ${isoPlusDays(today, -1)}`);
		// A block never visited has no re-scout to miss (it heads the rounds instead).
		const fresh = await buildBlock(w.farm, await soyIds(), { currentLevel: null });
		await sweep(w.org.id);
		expect(await rowsFor(fresh.id)).toHaveLength(0);
	});

	it('writes everything in one transaction: a refused row leaves no rows at all', async () => {
		const today = new Date().toISOString().slice(0, 10);
		const w = await alertWorld();
		await w.block.update({ lastVisitOn: isoPlusDays(today, -9), currentLevel: 'calm' });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id });
		await subscribe(w.scout, 'email');
		await subscribe(w.agronomist, 'email', { minLevel: 'action' });
		// Written after the first block's rows (blocks go in id order).
		const b2 = await buildBlock(w.farm, await soyIds(), {
			currentLevel: 'action',
			lastVisitOn: isoPlusDays(today, -9)
		});
		// A real refusal by the database for this one address, as a full disk or a lost
		// connection would refuse a write halfway through.
		const trigger = `refuse_${randomUUID().slice(0, 8)}`;
		await testDb().query(
			`CREATE TRIGGER ${trigger} BEFORE INSERT ON notifications FOR EACH ROW
			 IF NEW.to_address = '${w.agronomist.email}' THEN
			   SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'refused by the test';
			 END IF`
		);
		try {
			await expect(sweep(w.org.id)).rejects.toThrow(/refused by the test/);
		} finally {
			await testDb().query(`DROP TRIGGER ${trigger}`);
		}
		expect(await rowsFor(w.block.id)).toHaveLength(0);
		expect(await rowsFor(b2.id)).toHaveLength(0);
		expect(await sweep(w.org.id)).toBe(2);
		expect(who(await rowsFor(w.block.id))).toEqual([`${w.scout.id}:email`]);
		expect(who(await rowsFor(b2.id))).toEqual([`${w.agronomist.id}:email`]);
	});

	it('holds SMS in quiet hours, even for a severe block; e-mail goes at once', async () => {
		const now = new Date();
		const today = now.toISOString().slice(0, 10);
		const hhmm = (d: Date) => d.toISOString().slice(11, 16);
		const w = await alertWorld({ timezone: 'UTC' });
		await w.block.update({ lastVisitOn: isoPlusDays(today, -8), currentLevel: 'severe' });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id });
		const quiet = {
			quietStart: hhmm(new Date(now.getTime() - 3_600_000)),
			quietEnd: hhmm(new Date(now.getTime() + 2 * 3_600_000))
		};
		await subscribe(w.scout, 'sms', quiet);
		await subscribe(w.scout, 'email', quiet);
		expect(await sweep(w.org.id, now)).toBe(2);
		const rows = await rowsFor(w.block.id);
		const sms = rows.find((r) => r.channel === 'sms')!;
		expect(hhmm(sms.notBefore)).toBe(quiet.quietEnd);
		expect(sms.notBefore.getTime()).toBeGreaterThan(now.getTime() + 3_600_000);
		expect(rows.find((r) => r.channel === 'email')!.notBefore.getTime()).toBeLessThanOrEqual(
			now.getTime() + 1000
		);
	});

	it('two workers sweeping at once write each row once and both finish', async () => {
		const today = new Date().toISOString().slice(0, 10);
		const w = await alertWorld();
		const ids = await soyIds();
		const blocks = [w.block];
		for (let i = 0; i < 5; i++) blocks.push(await buildBlock(w.farm, ids));
		for (const b of blocks) {
			await b.update({ lastVisitOn: isoPlusDays(today, -8), currentLevel: 'action' });
			await ScoutingAssignment.create({ blockId: b.id, scoutId: w.scout.id });
		}
		await subscribe(w.scout, 'sms');
		await subscribe(w.scout, 'email');
		await subscribe(w.agronomist, 'email', { minLevel: 'action' });
		const counts = await Promise.all([sweep(w.org.id), sweep(w.org.id), sweep(w.org.id)]);
		const rows = await Notification.findAll({
			where: { organisationId: w.org.id, kind: 'scouting-overdue' }
		});
		expect(rows).toHaveLength(blocks.length * 3);
		expect(new Set(rows.map((r) => r.dedupeKey)).size).toBe(rows.length);
		// What each sweep counts may overlap (a row seen as new by two), but never falls short.
		expect(counts.reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(rows.length);
	});

	it('another organisation hears nothing of it', async () => {
		const today = new Date().toISOString().slice(0, 10);
		const w = await alertWorld();
		await w.block.update({ lastVisitOn: isoPlusDays(today, -12), currentLevel: 'severe' });
		const outsider = (await buildUser('agronomist', (await alertWorld()).org.id)).user;
		await subscribe(outsider, 'email', { minLevel: 'calm', blockId: w.block.id });
		await subscribe(w.agronomist, 'email', { minLevel: 'calm' });
		await sweep(w.org.id);
		expect(who(await rowsFor(w.block.id))).toEqual([`${w.agronomist.id}:email`]);
	});
});

// levelChanged / recommendationIssued write outbox rows in the caller's transaction, one per
// subscriber and channel, following each person's subscription rules.
import { afterAll, describe, expect, it } from 'vitest';
import { CAUTION_SMS, CAUTIONS } from '../../src/lib/cautions';
import { levelChanged, levelsChanged, recommendationIssued } from '../../src/lib/server/events';
import {
	AuditLog,
	Notification,
	Product,
	Recommendation,
	ScoutingAssignment,
	SmsOptOut
} from '../../src/lib/server/db/models';
import { alertWorld, assessmentAt, subscribe } from '../helpers/alerts';
import { buildBlock, buildUser, closeTestDb, testDb } from '../helpers/db';
import { soyIds } from '../helpers/advice';

afterAll(closeTestDb);

const rowsFor = (blockId: number) =>
	Notification.findAll({ where: { blockId }, order: [['id', 'ASC']] });

describe('level alerts', () => {
	it('one rise queues one SMS and one e-mail per subscriber, in the same transaction', async () => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms');
		await subscribe(w.grower, 'email');
		await subscribe(w.agronomist, 'sms', { minLevel: 'stirring' });
		await subscribe(w.agronomist, 'email', { minLevel: 'stirring', farmId: w.farm.id });
		await subscribe(w.scout, 'email', { minLevel: 'stirring' }); // not assigned: sees nothing
		const to = assessmentAt('action');
		await expect(
			testDb().transaction(async (t) => {
				await levelChanged({ block: w.block, from: 'calm', to, transaction: t });
				throw new Error('roll back');
			})
		).rejects.toThrow('roll back');
		expect(await rowsFor(w.block.id)).toHaveLength(0);

		await testDb().transaction((t) =>
			levelChanged({ block: w.block, from: 'calm', to, transaction: t })
		);
		const rows = await rowsFor(w.block.id);
		expect(rows.map((r) => `${r.userId}:${r.channel}`).sort()).toEqual(
			[
				`${w.grower.id}:sms`,
				`${w.grower.id}:email`,
				`${w.agronomist.id}:sms`,
				`${w.agronomist.id}:email`
			].sort()
		);
		const sms = rows.find((r) => r.channel === 'sms' && r.userId === w.grower.id)!;
		expect(sms.toAddress).toBe(w.grower.phoneE164);
		expect(sms.bodyText).toContain(w.block.name);
		expect(sms.bodyText).toContain('Action due');
		expect(sms.bodyText).toContain(`/blocks/${w.block.id}`);
		expect(sms.bodyText.length).toBeLessThan(320); // two SMS segments at most (common practice)
		const mail = rows.find((r) => r.channel === 'email' && r.userId === w.grower.id)!;
		expect(mail.toAddress).toBe(w.grower.email);
		expect(mail.bodyText).toContain('Action threshold: 250 per plant');
		expect(mail.bodyHtml).toContain('<table');
		expect(
			await AuditLog.count({ where: { action: 'level-changed', entityId: String(w.block.id) } })
		).toBe(1);
	});

	it('holds back a repeat only for the same block and level, and audits each change', async () => {
		// One pass over several blocks and levels: an alert for block A at "action" must not
		// hold back block B at "action", nor block A at "severe" (common practice: the repeat
		// window is per block and level).
		const w = await alertWorld();
		const other = await buildBlock(w.farm, await soyIds(), { currentLevel: 'calm' });
		await subscribe(w.grower, 'sms');
		const kinds = async () =>
			(await Notification.findAll({ where: { blockId: [w.block.id, other.id] } }))
				.map((r) => `${r.blockId === w.block.id ? 'A' : 'B'}:${r.kind}`)
				.sort();
		await levelsChanged([{ block: w.block, from: 'calm', to: assessmentAt('action') }]);
		expect(await kinds()).toEqual(['A:level-action']);
		await testDb().transaction((t) =>
			levelsChanged(
				[
					{ block: other, from: 'calm', to: assessmentAt('action') },
					{ block: w.block, from: 'action', to: assessmentAt('severe') }
				],
				t
			)
		);
		expect(await kinds()).toEqual(['A:level-action', 'A:level-severe', 'B:level-action']);
		await levelsChanged([
			{ block: w.block, from: 'calm', to: assessmentAt('action') }, // a repeat in the window
			{ block: other, from: 'action', to: assessmentAt('severe') }
		]);
		expect(await kinds()).toEqual([
			'A:level-action',
			'A:level-severe',
			'B:level-action',
			'B:level-severe'
		]);
		const audit = await AuditLog.findAll({
			where: { action: 'level-changed', entityId: [String(w.block.id), String(other.id)] },
			order: [['id', 'ASC']]
		});
		expect(audit.map((a) => [a.entityId === String(w.block.id) ? 'A' : 'B', a.details])).toEqual([
			['A', { from: 'calm', to: 'action', reason: assessmentAt('action').reason }],
			['B', { from: 'calm', to: 'action', reason: assessmentAt('action').reason }],
			['A', { from: 'action', to: 'severe', reason: assessmentAt('severe').reason }],
			['A', { from: 'calm', to: 'action', reason: assessmentAt('action').reason }],
			['B', { from: 'action', to: 'severe', reason: assessmentAt('severe').reason }]
		]);
		expect(audit.every((a) => a.organisationId === w.org.id && a.createdAt instanceof Date)).toBe(
			true
		);
	});

	it('respects the lowest level, a fall, the repeat window and assigned scouts', async () => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms', { minLevel: 'severe' });
		await subscribe(w.scout, 'sms', { minLevel: 'stirring' });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id });
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('action') });
		expect((await rowsFor(w.block.id)).map((r) => r.userId)).toEqual([w.scout.id]);
		await levelChanged({ block: w.block, from: 'severe', to: assessmentAt('action') }); // a fall
		await levelChanged({ block: w.block, from: 'stirring', to: assessmentAt('action') }); // repeat in window
		expect(await rowsFor(w.block.id)).toHaveLength(1);
		await levelChanged({ block: w.block, from: 'action', to: assessmentAt('severe') });
		expect((await rowsFor(w.block.id)).map((r) => r.kind)).toEqual([
			'level-action',
			'level-severe',
			'level-severe'
		]);
	});

	it('a block subscription wins over an all-blocks one; another organisation hears nothing', async () => {
		const w = await alertWorld();
		const other = await alertWorld();
		await subscribe(w.agronomist, 'email', { minLevel: 'stirring' });
		await subscribe(w.agronomist, 'email', { minLevel: 'severe', blockId: w.block.id });
		await subscribe(other.agronomist, 'email', { minLevel: 'stirring' });
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('action') });
		expect(await rowsFor(w.block.id)).toHaveLength(0);
		const outsider = (await buildUser('agronomist', other.org.id)).user;
		await subscribe(outsider, 'sms', { minLevel: 'stirring', blockId: w.block.id });
		await levelChanged({ block: w.block, from: 'action', to: assessmentAt('severe') });
		expect((await rowsFor(w.block.id)).map((r) => r.userId)).toEqual([w.agronomist.id]);
	});

	it('holds SMS in quiet hours until morning, unless the level is severe', async () => {
		const w = await alertWorld({ timezone: 'UTC' });
		const now = new Date();
		const hhmm = (d: Date) => d.toISOString().slice(11, 16);
		const start = hhmm(new Date(now.getTime() - 3_600_000));
		const end = hhmm(new Date(now.getTime() + 2 * 3_600_000));
		await subscribe(w.grower, 'sms', { minLevel: 'stirring', quietStart: start, quietEnd: end });
		await subscribe(w.grower, 'email', { minLevel: 'stirring', quietStart: start, quietEnd: end });
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('stirring') });
		const rows = await rowsFor(w.block.id);
		const held = rows.find((r) => r.channel === 'sms')!;
		expect(hhmm(held.notBefore)).toBe(end);
		expect(held.notBefore.getTime()).toBeGreaterThan(now.getTime() + 3_600_000);
		expect(rows.find((r) => r.channel === 'email')!.notBefore.getTime()).toBeLessThan(
			Date.now() + 1000
		);
		await levelChanged({ block: w.block, from: 'stirring', to: assessmentAt('severe') });
		const severe = (await rowsFor(w.block.id)).find(
			(r) => r.kind === 'level-severe' && r.channel === 'sms'
		)!;
		expect(severe.notBefore.getTime()).toBeLessThan(Date.now() + 1000);
	});

	it('queues a number that replied STOP as suppressed, with the reason', async () => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms');
		await SmsOptOut.create({ phoneE164: w.grower.phoneE164!, optedOutAt: new Date() });
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('action') });
		const [row] = await rowsFor(w.block.id);
		expect(row).toMatchObject({ status: 'suppressed' });
		expect(row.lastError).toMatch(/STOP/);
	});
});

describe('recommendation alerts', () => {
	it('goes to the grower only; a treat recommendation carries the cautions', async () => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms');
		await subscribe(w.grower, 'email');
		await subscribe(w.agronomist, 'email', { minLevel: 'stirring' });
		const product = await Product.create({
			organisationId: w.org.id,
			name: 'Test product 50 EC',
			activeIngredient: 'invented',
			iracGroup: '4A',
			rate: 100,
			rateUnit: 'mL/ha',
			reiHours: 12,
			phiDays: 21,
			beeHazard: 'high'
		});
		const rec = await Recommendation.create({
			organisationId: w.org.id,
			blockId: w.block.id,
			authorId: w.agronomist.id,
			productId: product.id,
			decision: 'treat',
			targetDate: '2025-07-08',
			warnings: [],
			status: 'issued',
			issuedAt: new Date()
		});
		await testDb().transaction((t) =>
			recommendationIssued({
				recommendationId: rec.id,
				blockId: w.block.id,
				organisationId: w.org.id,
				actorId: w.agronomist.id,
				transaction: t
			})
		);
		const rows = await rowsFor(w.block.id);
		expect(rows.map((r) => `${r.userId}:${r.channel}`).sort()).toEqual([
			`${w.grower.id}:email`,
			`${w.grower.id}:sms`
		]);
		const sms = rows.find((r) => r.channel === 'sms')!;
		expect(sms.bodyText).toContain(CAUTION_SMS);
		expect(sms.bodyText).toContain('Test product 50 EC');
		expect(sms.bodyText).toContain('Reply OK');
		const mail = rows.find((r) => r.channel === 'email')!;
		for (const c of CAUTIONS) {
			expect(mail.bodyText).toContain(c.text);
			expect(mail.bodyHtml).toContain(c.title);
		}
		expect(mail.bodyText).toContain('Re-entry interval (REI): 12 h');
		// A second call for the same recommendation queues nothing new (dedupe key).
		await recommendationIssued({
			recommendationId: rec.id,
			blockId: w.block.id,
			organisationId: w.org.id,
			actorId: w.agronomist.id
		});
		expect(await rowsFor(w.block.id)).toHaveLength(2);
	});
});

describe('level changes of a batch of visits', () => {
	it('queue, in one pass, what the changes one at a time would have queued', async () => {
		// Two worlds alike: one gets its changes one call at a time, the other all in one call.
		const make = async () => {
			const w = await alertWorld();
			const other = await buildBlock(w.farm, await soyIds(), { currentLevel: 'calm' });
			await subscribe(w.grower, 'sms', { minLevel: 'stirring' });
			await subscribe(w.agronomist, 'email', { minLevel: 'stirring' });
			await subscribe(w.agronomist, 'sms', { minLevel: 'action', blockId: other.id });
			return { ...w, other };
		};
		const changes = (w: Awaited<ReturnType<typeof make>>) => [
			{ block: w.block, from: 'calm' as const, to: assessmentAt('stirring') },
			{ block: w.other, from: 'calm' as const, to: assessmentAt('action') },
			{
				block: w.block,
				from: 'stirring' as const,
				to: { ...assessmentAt('stirring'), level: 'calm' as const }
			}, // a fall: audit only
			{ block: w.block, from: 'calm' as const, to: assessmentAt('stirring') }, // again: deduped
			{ block: w.block, from: 'stirring' as const, to: assessmentAt('severe') }
		];
		const one = await make();
		await testDb().transaction(async (t) => {
			for (const c of changes(one)) await levelChanged({ ...c, transaction: t });
		});
		const all = await make();
		await testDb().transaction((t) => levelsChanged(changes(all), t));
		const shape = async (w: Awaited<ReturnType<typeof make>>) => {
			const who = new Map([
				[Number(w.grower.id), 'grower'],
				[Number(w.agronomist.id), 'agronomist']
			]);
			const where = new Map([
				[Number(w.block.id), 'block'],
				[Number(w.other.id), 'other']
			]);
			const rows = await Notification.findAll({ where: { blockId: [w.block.id, w.other.id] } });
			const audits = await AuditLog.count({
				where: { action: 'level-changed', entityId: [String(w.block.id), String(w.other.id)] }
			});
			return {
				audits,
				rows: rows
					.map(
						(r) =>
							`${where.get(Number(r.blockId))} ${who.get(Number(r.userId))} ${r.channel} ${r.kind}`
					)
					.sort()
			};
		};
		const expected = await shape(one);
		expect(expected.audits).toBe(5);
		expect(expected.rows).toEqual([
			'block agronomist email level-severe',
			'block agronomist email level-stirring',
			'block grower sms level-severe',
			'block grower sms level-stirring',
			'other agronomist email level-action',
			'other agronomist sms level-action',
			'other grower sms level-action'
		]);
		expect(await shape(all)).toEqual(expected);
	});
});

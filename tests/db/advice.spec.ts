import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditLog, Recommendation } from '../../src/lib/server/db/models';
import { BLOOM, checkContext, treatmentWarnings } from '../../src/lib/server/advice/checks';
import {
	acknowledge,
	markApplied,
	saveRecommendation,
	withdraw
} from '../../src/lib/server/advice/recommendations';
import { rank } from '../../src/lib/server/advice/triage';
import { closeTestDb } from '../helpers/db';
import { day, deskScenario } from '../helpers/advice';

// The test helper's connection is the app's own db(), so the server code under test and the
// checks share one Sequelize instance on the test database.

type Scenario = Awaited<ReturnType<typeof deskScenario>>;
let s: Scenario;
const as = (
	u: { user: { id: number; name: string; email: string } },
	role: SessionUser['role']
): SessionUser => ({
	id: u.user.id,
	name: u.user.name,
	email: u.user.email,
	role,
	organisationId: s.org.id
});

beforeAll(async () => {
	s = await deskScenario();
});
afterAll(closeTestDb);

const product = {
	name: 'P',
	iracGroup: '4A',
	reiHours: 12,
	phiDays: 21,
	beeHazard: 'high' as const
};
const ctx = { expectedHarvest: '2026-09-01', bbch: 40, bbchOn: '2026-07-01', prior: [] };
const codes = (w: { code: string }[]) => w.map((x) => x.code).sort();

describe('label checks on a treat recommendation', () => {
	it('warns when the PHI runs past the expected harvest, and not when it ends before', () => {
		// 2026-08-15 + 21 days = 2026-09-05, after a 2026-09-01 harvest.
		expect(codes(treatmentWarnings(product, '2026-08-15', ctx))).toContain('phi-past-harvest');
		// 2026-08-10 + 21 days = 2026-08-31, the day before.
		expect(codes(treatmentWarnings(product, '2026-08-10', ctx))).not.toContain('phi-past-harvest');
	});

	it('warns about the same IRAC group used earlier this season, not about another group', () => {
		const prior = [
			{ id: 1, productName: 'Q', iracGroup: '4A', date: '2026-07-01', status: 'applied' }
		];
		expect(codes(treatmentWarnings(product, '2026-08-01', { ...ctx, prior }))).toContain(
			'irac-repeat'
		);
		const other = [{ ...prior[0], iracGroup: '3A' }];
		expect(codes(treatmentWarnings(product, '2026-08-01', { ...ctx, prior: other }))).not.toContain(
			'irac-repeat'
		);
	});

	it('flags bloom for BBCH 60-69 (BBCH scale: principal stage 6 is flowering)', () => {
		expect(BLOOM).toEqual({ from: 60, to: 69 });
		for (const bbch of [60, 65, 69]) {
			const w = treatmentWarnings(product, '2026-08-01', { ...ctx, bbch });
			expect(w.find((x) => x.code === 'bloom-pollinators')?.message).toMatch(
				/in bloom.*high bee hazard/
			);
		}
		expect(codes(treatmentWarnings(product, '2026-08-01', { ...ctx, bbch: 75 }))).not.toContain(
			'bloom-pollinators'
		);
	});

	it('always states the REI, and says so when no harvest date is known', () => {
		const w = treatmentWarnings(product, '2026-08-01', { ...ctx, expectedHarvest: null });
		expect(w.find((x) => x.code === 'rei')?.message).toContain('12 h');
		expect(w.find((x) => x.code === 'other')?.message).toMatch(
			/PHI of 21 days could not be checked/
		);
	});

	it('reads the block: harvest, last growth stage and the earlier 3A treatment', async () => {
		const c = await checkContext(s.hot, null);
		expect(c.expectedHarvest).toBe(day(10));
		expect(c.bbch).toBe(64);
		expect(c.prior.map((p) => p.iracGroup)).toEqual(['3A']);
		expect((await checkContext(s.mild, null)).prior).toEqual([]);
	});
});

describe('recommendation states', () => {
	it('will not issue over warnings without confirmation, and writes nothing', async () => {
		const before = await Recommendation.count({ where: { blockId: s.hot.id } });
		const d = {
			decision: 'treat' as const,
			productId: s.products.sameGroup.id,
			targetDate: day(0)
		};
		const res = await saveRecommendation(as(s.agronomist, 'agronomist'), s.hot.id, d, {
			issue: true
		});
		expect(res.ok).toBe(false);
		if (!res.ok) {
			expect(res.field).toBe('confirmWarnings');
			expect(codes(res.warnings)).toEqual([
				'bloom-pollinators',
				'irac-repeat',
				'phi-past-harvest',
				'rei'
			]);
		}
		expect(await Recommendation.count({ where: { blockId: s.hot.id } })).toBe(before);
	});

	it('issues, is acknowledged by the grower, applied, and a follow-up falls due', async () => {
		const agr = as(s.agronomist, 'agronomist');
		const d = {
			decision: 'treat' as const,
			productId: s.products.otherGroup.id,
			targetDate: day(0)
		};
		const res = await saveRecommendation(agr, s.hot.id, d, { issue: true, confirmWarnings: true });
		expect(res.ok).toBe(true);
		if (!res.ok) return;
		const id = res.rec.id;
		expect((await Recommendation.findByPk(id))!.status).toBe('issued');
		// Another grower of the same organisation cannot see it; the owner can.
		await expect(acknowledge(as(s.otherGrower, 'grower'), id)).rejects.toMatchObject({
			status: 404
		});
		expect(await acknowledge(as(s.grower, 'grower'), id)).toEqual({ ok: true });
		expect(await acknowledge(as(s.grower, 'grower'), id)).toMatchObject({ ok: false });
		expect(await markApplied(as(s.grower, 'grower'), id, day(0), 'Grower crew')).toEqual({
			ok: true
		});
		const rec = (await Recommendation.findByPk(id))!;
		expect(rec.status).toBe('applied');
		expect(rec.acknowledgedBy).toBe(s.grower.user.id);
		expect(rec.followUpDue).toBe(day(5));
		const trail = await AuditLog.findAll({
			where: { entity: 'recommendation', entityId: String(id) }
		});
		expect(trail.map((a) => a.action)).toEqual(
			expect.arrayContaining(['drafted', 'issued', 'acknowledged', 'applied'])
		);
		expect(await withdraw(agr, id)).toMatchObject({ ok: false });
	});

	it('refuses a scout and a product of another organisation', async () => {
		const d = { decision: 'no-action' as const };
		await expect(
			saveRecommendation(as(s.scout, 'scout'), s.hot.id, d, { issue: true })
		).rejects.toMatchObject({ status: 403 });
		const foreign = { decision: 'treat' as const, productId: 1, targetDate: day(0) };
		const res = await saveRecommendation(as(s.agronomist, 'agronomist'), s.hot.id, foreign, {
			issue: false
		});
		expect(res).toMatchObject({ ok: false, field: 'productId' });
	});
});

describe('triage order', () => {
	const row = (
		name: string,
		level: 'calm' | 'stirring' | 'action' | 'severe' | null,
		extra = {}
	) => ({
		id: name.length,
		name,
		farmId: 1,
		farmName: 'F',
		growerName: 'G',
		cropId: 1,
		crop: 'c',
		pestId: 1,
		pest: 'p',
		level,
		reason: null,
		lastVisitOn: day(-2),
		rescoutDays: 7,
		daysToAction: null,
		actionDate: null,
		scouts: null,
		scoutIds: null,
		openRecs: 0,
		followUpDue: null,
		...extra
	});
	it('ranks level first, then days to threshold, then overdue scouting', () => {
		const out = rank(
			[
				row('calm-old', 'calm', { lastVisitOn: day(-20) }),
				row('stirring-late', 'stirring', { daysToAction: 6 }),
				row('severe', 'severe'),
				row('stirring-soon', 'stirring', { daysToAction: 2 }),
				row('calm-fresh', 'calm')
			],
			day(0)
		);
		expect(out.map((r) => r.name)).toEqual([
			'severe',
			'stirring-soon',
			'stirring-late',
			'calm-old',
			'calm-fresh'
		]);
		expect(out.find((r) => r.name === 'calm-old')!.overdueDays).toBe(13);
	});
});

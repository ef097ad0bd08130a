// The scout's day: due at the scout's own interval after the last visit, or sooner when an open
// recommendation asks for a follow-up visit by a date (the rule the desk and overdue alerts use).
import { afterAll, describe, expect, it } from 'vitest';
import { isoPlusDays } from '../../src/lib/engine';
import { Recommendation, ScoutingAssignment } from '../../src/lib/server/db/models';
import { scoutsDay } from '../../src/lib/server/scouting/rounds';
import { alertWorld } from '../helpers/alerts';
import { soyIds } from '../helpers/advice';
import { buildBlock, closeTestDb } from '../helpers/db';

afterAll(closeTestDb);

describe("the scout's day", () => {
	it('is due by the interval, or earlier by an open follow-up date; a met follow-up no longer counts', async () => {
		const now = new Date();
		const today = now.toISOString().slice(0, 10);
		const w = await alertWorld();
		const session = {
			id: w.scout.id,
			email: w.scout.email,
			name: w.scout.name,
			role: 'scout' as const,
			organisationId: w.org.id
		};
		// Seen 2 days ago, every 7 days: due in 5.
		await w.block.update({ lastVisitOn: isoPlusDays(today, -2) });
		await ScoutingAssignment.create({ blockId: w.block.id, scoutId: w.scout.id, intervalDays: 7 });
		// Same, but a follow-up visit was asked for by yesterday.
		const b2 = await buildBlock(w.farm, await soyIds(), { lastVisitOn: isoPlusDays(today, -2) });
		await ScoutingAssignment.create({ blockId: b2.id, scoutId: w.scout.id, intervalDays: 7 });
		const rec = await Recommendation.create({
			organisationId: w.org.id,
			blockId: b2.id,
			authorId: w.agronomist.id,
			decision: 'rescout',
			rescoutBy: isoPlusDays(today, -1),
			followUpDue: isoPlusDays(today, -1),
			warnings: [],
			status: 'issued',
			issuedAt: now
		});
		const day = async () => new Map((await scoutsDay(session, now)).map((b) => [b.id, b]));
		let d = await day();
		expect(d.get(w.block.id)).toMatchObject({ dueIn: 5, status: 'later' });
		expect(d.get(b2.id)).toMatchObject({ dueIn: -1, status: 'overdue' });
		// Overdue blocks come first.
		expect((await scoutsDay(session, now))[0].id).toBe(b2.id);
		// A follow-up date after the last visit only: once visited past it, the interval rules.
		await rec.update({ followUpDue: isoPlusDays(today, -3) });
		d = await day();
		expect(d.get(b2.id)).toMatchObject({ dueIn: 5, status: 'later' });
	});
});

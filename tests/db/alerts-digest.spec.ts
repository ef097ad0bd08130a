// The agronomists' daily digest for an organisation of the test's own: levels, late blocks by
// the desk's rule, open recommendations, and the cautions whenever it lists one.
import { afterAll, describe, expect, it } from 'vitest';
import { CAUTIONS } from '../../src/lib/cautions';
import { isoPlusDays } from '../../src/lib/engine';
import { digestParts, queueDigests } from '../../src/lib/server/alerts/digest';
import { esc } from '../../src/lib/server/alerts/html';
import { currentSettings } from '../../src/lib/server/alerts/settings';
import { Notification, Product, Recommendation } from '../../src/lib/server/db/models';
import { alertWorld, subscribe } from '../helpers/alerts';
import { soyIds } from '../helpers/advice';
import { buildBlock, closeTestDb, testDb } from '../helpers/db';

afterAll(closeTestDb);

const section = (p: Awaited<ReturnType<typeof digestParts>>, title: string) =>
	p.sections!.find((s) => s.title === title)!.lines;

describe('daily digest', () => {
	it('lists levels, late blocks and open recommendations, with the cautions', async () => {
		const now = new Date(`${new Date().toISOString().slice(0, 10)}T12:00:00Z`);
		const today = now.toISOString().slice(0, 10);
		const w = await alertWorld({ timezone: 'UTC' });
		const ids = await soyIds();
		const at = (currentLevel: 'severe' | 'action' | 'stirring', ago: number, name: string) =>
			buildBlock(w.farm, ids, {
				name,
				currentLevel,
				currentReason: `Invented reason for ${name}.`,
				lastVisitOn: isoPlusDays(today, -ago)
			});
		const severe = await at('severe', 1, `Severe ${w.org.id}`);
		const action = await at('action', 10, `Action ${w.org.id}`); // 3 days past its 7
		await at('stirring', 2, `Stirring ${w.org.id}`);
		// alertWorld's own block: calm, never visited.
		const p = await Product.create({
			organisationId: w.org.id,
			name: 'Invented 10 EC',
			activeIngredient: 'invented',
			iracGroup: '3A',
			rate: 40,
			rateUnit: 'mL/ha',
			reiHours: 24,
			phiDays: 14,
			beeHazard: 'high'
		});
		const rec = (blockId: number, over: Partial<Recommendation>) =>
			Recommendation.create({
				organisationId: w.org.id,
				blockId,
				authorId: w.agronomist.id,
				decision: 'rescout',
				warnings: [],
				status: 'issued',
				issuedAt: new Date(),
				...over
			});
		await rec(severe.id, { decision: 'treat', productId: p.id, targetDate: today });
		await rec(action.id, { rescoutBy: isoPlusDays(today, 2) });
		await rec(action.id, { decision: 'no-action', status: 'acknowledged' }); // not listed

		const parts = await digestParts(testDb(), currentSettings(), w.org.id, today);
		expect(parts.intro[0]).toBe('4 blocks: 1 Severe, 1 Action due, 1 Stirring, 1 Calm.');
		expect(section(parts, 'Action due or severe')).toEqual([
			`${severe.name} (${w.farm.name}): Severe. Invented reason for ${severe.name}.`,
			`${action.name} (${w.farm.name}): Action due. Invented reason for ${action.name}.`
		]);
		expect(section(parts, 'Scouting overdue')).toEqual([
			`${action.name} (${w.farm.name}): last visit ${isoPlusDays(today, -10)}, 3 day(s) overdue`,
			`${w.block.name} (${w.farm.name}): no visit yet`
		]);
		expect(section(parts, 'Recommendations not yet acknowledged')).toEqual([
			`${severe.name} (${w.farm.name}): Treat with Invented 10 EC (IRAC group 3A) by ${today}; issued ${today}`,
			`${action.name} (${w.farm.name}): Re-scout by ${isoPlusDays(today, 2)}; issued ${today}`
		]);
		expect(parts.cautions).toBe(true);

		// The queued e-mail carries the same, cautions included, in both parts.
		await subscribe(w.agronomist, 'email', { minLevel: 'calm' });
		expect(await queueDigests(testDb(), currentSettings(), now, w.org.id)).toBe(1);
		expect(await queueDigests(testDb(), currentSettings(), now, w.org.id)).toBe(0);
		const mail = await Notification.findOne({ where: { userId: w.agronomist.id, kind: 'digest' } });
		expect(mail!.bodyText).toContain('Treat with Invented 10 EC');
		expect(mail!.bodyHtml).toContain(esc(`${action.name} (${w.farm.name}): last visit`));
		for (const c of CAUTIONS) {
			expect(mail!.bodyText).toContain(c.text);
			expect(mail!.bodyHtml).toContain(esc(c.text));
		}
	});

	it('with nothing open it lists none and needs no cautions', async () => {
		const today = new Date().toISOString().slice(0, 10);
		const w = await alertWorld();
		await w.block.update({ lastVisitOn: today });
		const parts = await digestParts(testDb(), currentSettings(), w.org.id, today);
		expect(section(parts, 'Recommendations not yet acknowledged')).toEqual(['None.']);
		expect(section(parts, 'Scouting overdue')).toEqual(['None.']);
		expect(parts.cautions).toBe(false);
	});
});

// Every message that carries a recommendation carries the cautions (src/lib/cautions.ts) and
// defers to the label: each decision's e-mail in text and HTML, its SMS by a closing line, and
// a level alert on a block with an open treat recommendation.
import { afterAll, describe, expect, it } from 'vitest';
import { CAUTION_SMS, CAUTION_SMS_SHORT, CAUTIONS } from '../../src/lib/cautions';
import { DECISIONS } from '../../src/lib/domain';
import { levelChanged } from '../../src/lib/server/events';
import { esc } from '../../src/lib/server/alerts/html';
import { queueRecommendationAlerts } from '../../src/lib/server/alerts/recommendationAlerts';
import { Notification, Product, Recommendation } from '../../src/lib/server/db/models';
import { alertWorld, assessmentAt, subscribe } from '../helpers/alerts';
import { closeTestDb } from '../helpers/db';

afterAll(closeTestDb);

function expectCautions(mail: Notification) {
	expect(mail.bodyText).toContain('Cautions');
	expect(mail.bodyHtml).toContain('Cautions');
	for (const c of CAUTIONS) {
		expect(mail.bodyText).toContain(`${c.title}: ${c.text}`);
		expect(mail.bodyHtml).toContain(esc(c.title));
		expect(mail.bodyHtml).toContain(esc(c.text));
	}
}

async function product(organisationId: number) {
	return Product.create({
		organisationId,
		name: 'Invented 20 SC',
		activeIngredient: 'invented',
		iracGroup: '4C',
		rate: 50,
		rateUnit: 'mL/ha',
		reiHours: 12,
		phiDays: 7,
		beeHazard: 'high'
	});
}

describe('cautions on every recommendation message', () => {
	it.each(DECISIONS)('a "%s" recommendation: e-mail text and HTML, and the SMS', async (d) => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms');
		await subscribe(w.grower, 'email');
		const p = d === 'treat' ? await product(w.org.id) : null;
		const rec = await Recommendation.create({
			organisationId: w.org.id,
			blockId: w.block.id,
			authorId: w.agronomist.id,
			productId: p?.id ?? null,
			decision: d,
			targetDate: d === 'treat' ? '2026-07-08' : null,
			rescoutBy: d === 'rescout' ? '2026-07-10' : null,
			notes: d === 'other' ? 'Mow the headland strip.' : null,
			warnings: [],
			status: 'issued',
			issuedAt: new Date()
		});
		expect(await queueRecommendationAlerts(rec.id)).toBe(2);
		const rows = await Notification.findAll({ where: { recommendationId: rec.id } });
		expectCautions(rows.find((r) => r.channel === 'email')!);
		const sms = rows.find((r) => r.channel === 'sms')!.bodyText;
		expect(sms.endsWith(d === 'treat' ? CAUTION_SMS : CAUTION_SMS_SHORT)).toBe(true);
		expect(sms).toMatch(/label and local rules/);
		// At most two concatenated GSM-7 segments (2 x 153 characters; common practice).
		expect(sms.length).toBeLessThanOrEqual(306);
		expect(sms).toMatch(/^[\x20-\x7e]+$/); // plain ASCII, so no switch to 70-character UCS-2 parts
	});

	it('a level alert on a block with an open treat recommendation carries them too', async () => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms');
		await subscribe(w.grower, 'email');
		const p = await product(w.org.id);
		await Recommendation.create({
			organisationId: w.org.id,
			blockId: w.block.id,
			authorId: w.agronomist.id,
			productId: p.id,
			decision: 'treat',
			warnings: [],
			status: 'acknowledged',
			issuedAt: new Date()
		});
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('action') });
		const rows = await Notification.findAll({ where: { blockId: w.block.id } });
		expectCautions(rows.find((r) => r.channel === 'email')!);
		expect(rows.find((r) => r.channel === 'sms')!.bodyText).toContain(CAUTION_SMS);
	});
});

// Alerts end to end against the running app, its in-process worker and the SMS and mail fakes.
import twilio from 'twilio';
import { afterAll, describe, expect, it } from 'vitest';
import { levelChanged } from '../../src/lib/server/events';
import { Notification, Recommendation, SmsOptOut } from '../../src/lib/server/db/models';
import { APP, mailTo } from '../helpers/app';
import { alertWorld, assessmentAt, eventually, smsFor, subscribe, textIn } from '../helpers/alerts';
import { closeTestDb } from '../helpers/db';

afterAll(closeTestDb);

const TOKEN = process.env.TWILIO_AUTH_TOKEN ?? 'fake-auth-token-for-local-use';
const outbound = async (n: string) =>
	(await smsFor(n)).filter((m) => m.direction === 'outbound-api');

describe('alerts through the app', { timeout: 60_000 }, () => {
	it('one level change gives exactly one SMS and one e-mail to each subscriber', async () => {
		const w = await alertWorld();
		for (const u of [w.grower, w.agronomist]) {
			await subscribe(u, 'sms');
			await subscribe(u, 'email');
		}
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('action') });
		const rows = () => Notification.findAll({ where: { blockId: w.block.id } });
		await eventually(
			async () =>
				(await rows()).every((r) => r.status === (r.channel === 'sms' ? 'delivered' : 'sent')),
			30_000,
			'delivery'
		);
		await new Promise((r) => setTimeout(r, 1500)); // room for a duplicate to show up
		for (const u of [w.grower, w.agronomist]) {
			const texts = await outbound(u.phoneE164!);
			expect(texts).toHaveLength(1);
			expect(texts[0].body).toContain(w.block.name);
			// The in-app worker's digest sweep (once a minute) may also greet the new agronomist
			// with the day's digest; only the level alert counts here.
			const mails = (await mailTo(u.email)).filter((m) => !m.subject.startsWith('Cornicle digest'));
			expect(mails).toHaveLength(1);
			expect(mails[0].html).toContain('Figures');
			expect(mails[0].text).toContain('Action threshold');
		}
		expect((await rows()).every((r) => r.providerId)).toBe(true);
	});

	it('refuses unsigned and forged status callbacks with 403', async () => {
		const url = `${APP}/api/webhooks/sms/status?n=1&a=1`;
		const params = { MessageSid: 'SM' + 'a'.repeat(32), MessageStatus: 'delivered' };
		const post = (sig?: string) =>
			fetch(url, {
				method: 'POST',
				headers: {
					'content-type': 'application/x-www-form-urlencoded',
					...(sig ? { 'x-twilio-signature': sig } : {})
				},
				body: new URLSearchParams(params)
			});
		expect((await post()).status).toBe(403);
		expect(
			(await post(twilio.getExpectedTwilioSignature('someone-else', url, params))).status
		).toBe(403);
		// Signed for other parameters: the signature covers every parameter.
		const other = twilio.getExpectedTwilioSignature(TOKEN, url, {
			...params,
			MessageStatus: 'sent'
		});
		expect((await post(other)).status).toBe(403);
		const good = await post(twilio.getExpectedTwilioSignature(TOKEN, url, params));
		expect(good.status).toBe(200);
		expect(await good.json()).toEqual({ changed: false }); // no row has that message id
		const inbound = await fetch(`${APP}/api/webhooks/sms/inbound`, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				'x-twilio-signature': 'forged'
			},
			body: new URLSearchParams({ From: '+17015550000', Body: 'STOP' })
		});
		expect(inbound.status).toBe(403);
	});

	it('STOP stops further SMS to the number until START, with confirmations', async () => {
		const w = await alertWorld();
		await subscribe(w.grower, 'sms', { minLevel: 'stirring' });
		const n = w.grower.phoneE164!;
		const stop = await textIn(n, 'Stop');
		expect(stop.status).toBe(200);
		expect(stop.replies[0]).toMatch(/unsubscribed.*START/);
		expect(await SmsOptOut.findByPk(n)).not.toBeNull();
		expect((await textIn(n, 'HELP')).replies[0]).toMatch(/STOP/);
		await levelChanged({ block: w.block, from: 'calm', to: assessmentAt('stirring') });
		const [held] = await Notification.findAll({ where: { blockId: w.block.id } });
		expect(held.status).toBe('suppressed');
		const start = await textIn(n, 'START');
		expect(start.replies[0]).toMatch(/subscribed/);
		expect(await SmsOptOut.findByPk(n)).toBeNull();
		await levelChanged({ block: w.block, from: 'stirring', to: assessmentAt('action') });
		const texts = await eventually(
			async () => {
				const t = await outbound(n);
				return t.length ? t : null;
			},
			20_000,
			'an SMS after START'
		);
		expect(texts).toHaveLength(1);
		expect(texts[0].body).toContain('Action due');
	});

	it("a reply of OK acknowledges the grower's latest issued recommendation", async () => {
		const w = await alertWorld();
		const mk = (issuedAt: Date) =>
			Recommendation.create({
				organisationId: w.org.id,
				blockId: w.block.id,
				authorId: w.agronomist.id,
				decision: 'rescout',
				rescoutBy: '2025-07-10',
				warnings: [],
				status: 'issued',
				issuedAt
			});
		const older = await mk(new Date(Date.now() - 86_400_000));
		const latest = await mk(new Date());
		const r = await textIn(w.grower.phoneE164!, 'ok!');
		expect(r.replies[0]).toContain('acknowledged');
		await latest.reload();
		await older.reload();
		expect(latest).toMatchObject({ status: 'acknowledged', acknowledgedBy: w.grower.id });
		expect(older.status).toBe('issued');
		// The agronomist's number is not a grower's: nothing to acknowledge.
		expect((await textIn(w.agronomist.phoneE164!, 'OK')).replies[0]).toMatch(
			/no open recommendation/
		);
	});
});

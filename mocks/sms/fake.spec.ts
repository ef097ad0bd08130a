// The SMS fake driven by the real twilio SDK, as the app drives it; callbacks are checked with
// the SDK's own validateRequest (the provider's documented X-Twilio-Signature scheme).
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import twilio from 'twilio';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alertSettings } from '../../src/lib/server/alerts/settings';
import { smsClient } from '../../src/lib/server/alerts/sms';
import { smsFake } from './api';

const SID = 'AC00000000000000000000000000000009';
const TOKEN = 'token-for-the-fake-spec';
const FROM = '+15005550006';
let fake: Server;
let hook: Server;
let base = '';
let hookUrl = '';
const received: { url: string; params: Record<string, string>; valid: boolean }[] = [];

const listen = (s: Server) =>
	new Promise<string>((r) =>
		s.listen(0, '127.0.0.1', () => r(`http://127.0.0.1:${(s.address() as AddressInfo).port}`))
	);

beforeAll(async () => {
	hook = createServer((req, res) => {
		let body = '';
		req.on('data', (c) => (body += c));
		req.on('end', () => {
			const params = Object.fromEntries(new URLSearchParams(body));
			const url = `${hookUrl}${req.url!.replace(/^\/+/, '/')}`;
			const valid = twilio.validateRequest(
				TOKEN,
				String(req.headers['x-twilio-signature']),
				url,
				params
			);
			received.push({ url, params, valid });
			res.writeHead(200, { 'content-type': 'text/xml' });
			res.end(
				req.url!.includes('inbound')
					? '<?xml version="1.0"?><Response><Message>Got &quot;it&quot; &amp; thanks</Message></Response>'
					: ''
			);
		});
	});
	hookUrl = await listen(hook);
	fake = createServer(
		smsFake({ accountSid: SID, authToken: TOKEN, from: FROM, inboundUrl: `${hookUrl}/inbound` })
	);
	base = await listen(fake);
	await fetch(`${base}/_fake/behaviour`, {
		method: 'POST',
		body: JSON.stringify({ callbackDelayMs: 10 })
	});
});

afterAll(() => {
	fake.close();
	hook.close();
});

const client = () =>
	smsClient(
		alertSettings({
			TWILIO_ACCOUNT_SID: SID,
			TWILIO_AUTH_TOKEN: TOKEN,
			TWILIO_FROM: FROM,
			TWILIO_BASE_URL: base,
			ALERTS_SEND_TIMEOUT_MS: '2000'
		})
	);

describe('SMS fake', () => {
	it('creates, fetches and lists messages through the SDK, then reports signed statuses', async () => {
		const m = await client().messages.create({
			to: '+17015550100',
			from: FROM,
			body: 'Hello field',
			statusCallback: `${hookUrl}/status?n=1&a=1`
		});
		expect(m.sid).toMatch(/^SM[0-9a-f]{32}$/);
		expect(m.status).toBe('queued');
		const again = await client().messages(m.sid).fetch();
		expect(again.body).toBe('Hello field');
		const list = await client().messages.list({ to: '+17015550100', limit: 10 });
		expect(list.map((x) => x.sid)).toContain(m.sid);
		await new Promise((r) => setTimeout(r, 150));
		const mine = received.filter((r) => r.params.MessageSid === m.sid);
		expect(mine.map((r) => r.params.MessageStatus)).toEqual(['sent', 'delivered']);
		expect(mine.every((r) => r.valid)).toBe(true);
		expect((await client().messages(m.sid).fetch()).status).toBe('delivered');
	});

	it('a signature made with another token does not validate', () => {
		const params = { MessageSid: 'SM' + '0'.repeat(32), MessageStatus: 'delivered' };
		const url = `${hookUrl}/status?n=1&a=1`;
		const forged = twilio.getExpectedTwilioSignature('not-the-token', url, params);
		expect(twilio.validateRequest(TOKEN, forged, url, params)).toBe(false);
		expect(
			twilio.validateRequest(
				TOKEN,
				twilio.getExpectedTwilioSignature(TOKEN, url, params),
				url,
				params
			)
		).toBe(true);
	});

	it('fails a share of sends with 503 when told to, and refuses bad numbers and credentials', async () => {
		await fetch(`${base}/_fake/behaviour`, {
			method: 'POST',
			body: JSON.stringify({ failRate: 1 })
		});
		await expect(
			client().messages.create({ to: '+17015550101', from: FROM, body: 'x' })
		).rejects.toMatchObject({ status: 503 });
		await fetch(`${base}/_fake/behaviour`, {
			method: 'POST',
			body: JSON.stringify({ failRate: 0 })
		});
		await expect(
			client().messages.create({ to: '12345', from: FROM, body: 'x' })
		).rejects.toMatchObject({ status: 400, code: 21211 });
		const wrong = smsClient(
			alertSettings({
				TWILIO_ACCOUNT_SID: SID,
				TWILIO_AUTH_TOKEN: 'nope',
				TWILIO_FROM: FROM,
				TWILIO_BASE_URL: base
			})
		);
		await expect(
			wrong.messages.create({ to: '+17015550101', from: FROM, body: 'x' })
		).rejects.toMatchObject({ status: 401 });
		expect((await client().messages.list({ to: '+17015550101' })).length).toBe(0);
	});

	it('hangs when told to, so the client times out while the message still exists', async () => {
		await fetch(`${base}/_fake/behaviour`, {
			method: 'POST',
			body: JSON.stringify({ hangRate: 1, hangMs: 3000 })
		});
		await expect(
			client().messages.create({ to: '+17015550102', from: FROM, body: 'slow' })
		).rejects.toThrow(/timeout/i);
		await fetch(`${base}/_fake/behaviour`, {
			method: 'POST',
			body: JSON.stringify({ hangRate: 0 })
		});
		expect((await client().messages.list({ to: '+17015550102' })).map((m) => m.body)).toEqual([
			'slow'
		]);
	});

	it('delivers an inbound text to the app, signed, and keeps the TwiML reply in the inbox', async () => {
		const res = await fetch(`${base}/_fake/inbound`, {
			method: 'POST',
			body: JSON.stringify({ from: '+17015550103', body: 'STOP' })
		});
		expect(await res.json()).toMatchObject({ status: 200, replies: ['Got "it" & thanks'] });
		const got = received.find(
			(r) => r.url.endsWith('/inbound') && r.params.From === '+17015550103'
		);
		expect(got).toMatchObject({ valid: true, params: { Body: 'STOP', To: FROM } });
		const convo = (await (await fetch(`${base}/_fake/messages?number=%2B17015550103`)).json()) as {
			direction: string;
		}[];
		expect(convo.map((m) => m.direction)).toEqual(['outbound-reply', 'inbound']);
		const page = await (await fetch(`${base}/phone/%2B17015550103`)).text();
		expect(page).toContain('Got &quot;it&quot; &amp; thanks');
	});
});

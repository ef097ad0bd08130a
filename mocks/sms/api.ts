import type { IncomingMessage, ServerResponse } from 'node:http';
import { timingSafeEqual } from 'node:crypto';
import { deliver, twimlMessages, type CallbackRecord } from './lifecycle';
import { inboxPage, phonePage } from './inbox';
import { messageResource, restError } from './resource';
import { postSigned } from './signed';
import { DEFAULT_BEHAVIOUR, SmsStore, type FakeBehaviour } from './store';

export interface FakeOptions {
	accountSid: string;
	authToken: string;
	from: string;
	/** Where inbound texts go (the app's inbound webhook). */
	inboundUrl: string;
}

const E164 = /^\+[1-9]\d{6,14}$/;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function readBody(req: IncomingMessage): Promise<string> {
	const chunks: Buffer[] = [];
	for await (const c of req) chunks.push(c as Buffer);
	return Buffer.concat(chunks).toString('utf8');
}

function send(res: ServerResponse, status: number, body: unknown, type = 'application/json') {
	if (res.headersSent || res.destroyed) return;
	res.writeHead(status, { 'content-type': type });
	res.end(typeof body === 'string' ? body : JSON.stringify(body));
}

function authorised(req: IncomingMessage, o: FakeOptions) {
	const expected = Buffer.from(
		'Basic ' + Buffer.from(`${o.accountSid}:${o.authToken}`).toString('base64')
	);
	const got = Buffer.from(req.headers.authorization ?? '');
	return got.length === expected.length && timingSafeEqual(got, expected);
}

/** The fake's HTTP handler: the provider's REST Messages API, a control API and a web inbox. */
export function smsFake(o: FakeOptions) {
	const store = new SmsStore();
	const callbacks: CallbackRecord[] = [];
	const base = `/2010-04-01/Accounts/${o.accountSid}/Messages`;

	async function create(req: IncomingMessage, res: ServerResponse) {
		const p = new URLSearchParams(await readBody(req));
		const to = p.get('To') ?? '';
		const body = p.get('Body') ?? '';
		const b = store.behaviour;
		if (b.latencyMs) await sleep(b.latencyMs);
		if (!E164.test(to))
			return send(
				res,
				400,
				restError(400, 21211, `The 'To' number ${to} is not a valid phone number.`)
			);
		if (p.get('From') !== o.from)
			return send(
				res,
				400,
				restError(
					400,
					21606,
					`The From phone number ${p.get('From')} is not a valid, SMS-capable number for this account.`
				)
			);
		if (!body.trim()) return send(res, 400, restError(400, 21602, 'Message body is required.'));
		if (Math.random() < b.failRate)
			return send(
				res,
				503,
				restError(503, 20503, 'Service unavailable (the fake was told to fail this send).')
			);
		const m = store.add({
			accountSid: o.accountSid,
			direction: 'outbound-api',
			from: o.from,
			to,
			body,
			status: 'queued',
			errorCode: null,
			errorMessage: null,
			statusCallback: p.get('StatusCallback')
		});
		void deliver(store, m, o.authToken, callbacks, Math.random() < b.undeliveredRate);
		if (Math.random() < b.hangRate) await sleep(b.hangMs);
		send(res, 201, messageResource(m));
	}

	function list(url: URL, res: ServerResponse) {
		const to = url.searchParams.get('To') ?? undefined;
		const from = url.searchParams.get('From') ?? undefined;
		const size = Math.min(1000, Number(url.searchParams.get('PageSize') ?? 50) || 50);
		const page = Number(url.searchParams.get('Page') ?? 0) || 0;
		const all = store.list({ to, from });
		const slice = all.slice(page * size, (page + 1) * size);
		const q = (n: number) => {
			const u = new URLSearchParams(url.searchParams);
			u.set('Page', String(n));
			u.set('PageSize', String(size));
			return `${base}.json?${u}`;
		};
		send(res, 200, {
			messages: slice.map(messageResource),
			end: page * size + slice.length - 1,
			first_page_uri: q(0),
			next_page_uri: (page + 1) * size < all.length ? q(page + 1) : null,
			page,
			page_size: size,
			previous_page_uri: page > 0 ? q(page - 1) : null,
			start: page * size,
			uri: q(page)
		});
	}

	async function inbound(req: IncomingMessage, res: ServerResponse) {
		const j = JSON.parse((await readBody(req)) || '{}') as {
			from?: string;
			body?: string;
			url?: string;
		};
		if (!j.from || !E164.test(j.from))
			return send(res, 400, { message: 'from: an E.164 number is required' });
		const m = store.add({
			accountSid: o.accountSid,
			direction: 'inbound',
			from: j.from,
			to: o.from,
			body: j.body ?? '',
			status: 'received',
			errorCode: null,
			errorMessage: null,
			statusCallback: null
		});
		const params = {
			AccountSid: o.accountSid,
			ApiVersion: '2010-04-01',
			Body: m.body,
			From: m.from,
			MessageSid: m.sid,
			NumMedia: '0',
			NumSegments: '1',
			SmsMessageSid: m.sid,
			SmsSid: m.sid,
			SmsStatus: 'received',
			To: m.to
		};
		const result = await postSigned(j.url ?? o.inboundUrl, params, o.authToken);
		const replies = result.status === 200 ? twimlMessages(result.body) : [];
		for (const text of replies) {
			const r = store.add({
				accountSid: o.accountSid,
				direction: 'outbound-reply',
				from: o.from,
				to: m.from,
				body: text,
				status: 'delivered',
				errorCode: null,
				errorMessage: null,
				statusCallback: null
			});
			store.setStatus(r.sid, 'delivered');
		}
		send(res, 200, { status: result.status, error: result.error, replies });
	}

	async function control(req: IncomingMessage, res: ServerResponse, url: URL) {
		const path = url.pathname;
		if (path === '/_fake/messages' && req.method === 'GET') {
			const n = url.searchParams.get('number') ?? undefined;
			return send(res, 200, store.list({ number: n }));
		}
		if (path === '/_fake/behaviour') {
			if (req.method === 'POST') {
				const j = JSON.parse((await readBody(req)) || '{}') as Partial<FakeBehaviour>;
				for (const k of Object.keys(DEFAULT_BEHAVIOUR) as (keyof FakeBehaviour)[]) {
					if (typeof j[k] === 'number' && Number.isFinite(j[k]) && j[k]! >= 0)
						store.behaviour[k] = j[k]!;
				}
			}
			return send(res, 200, store.behaviour);
		}
		if (path === '/_fake/callbacks' && req.method === 'GET') {
			const sid = url.searchParams.get('sid');
			return send(res, 200, sid ? callbacks.filter((c) => c.sid === sid) : callbacks.slice(-500));
		}
		if (path === '/_fake/reset' && req.method === 'POST') {
			store.reset();
			callbacks.length = 0;
			return send(res, 204, '');
		}
		if (path === '/_fake/inbound' && req.method === 'POST') return inbound(req, res);
		send(res, 404, { message: `No fake control endpoint ${req.method} ${path}` });
	}

	return async function handle(req: IncomingMessage, res: ServerResponse) {
		const url = new URL(req.url ?? '/', 'http://fake');
		try {
			if (url.pathname.startsWith('/_fake/')) return await control(req, res, url);
			if (url.pathname === '/' && req.method === 'GET')
				return send(res, 200, inboxPage(store), 'text/html; charset=utf-8');
			if (url.pathname.startsWith('/phone/') && req.method === 'GET') {
				const n = decodeURIComponent(url.pathname.slice('/phone/'.length));
				return send(res, 200, phonePage(store, n), 'text/html; charset=utf-8');
			}
			if (!url.pathname.startsWith('/2010-04-01/'))
				return send(res, 404, restError(404, 20404, 'The requested resource was not found'));
			if (!authorised(req, o)) return send(res, 401, restError(401, 20003, 'Authenticate'));
			if (url.pathname === `${base}.json`) {
				if (req.method === 'POST') return await create(req, res);
				if (req.method === 'GET') return list(url, res);
			}
			const one = url.pathname.match(new RegExp(`^${base}/(SM[0-9a-f]{32})\\.json$`));
			if (one && req.method === 'GET') {
				const m = store.get(one[1]);
				return m
					? send(res, 200, messageResource(m))
					: send(
							res,
							404,
							restError(404, 20404, `The requested resource ${url.pathname} was not found`)
						);
			}
			send(res, 404, restError(404, 20404, `The requested resource ${url.pathname} was not found`));
		} catch (e) {
			send(res, 500, restError(500, 20500, (e as Error).message));
		}
	};
}

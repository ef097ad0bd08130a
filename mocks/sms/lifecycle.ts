import { postSigned, type PostResult } from './signed';
import type { FakeMessage, FakeStatus, SmsStore } from './store';

export interface CallbackRecord {
	sid: string;
	status: FakeStatus;
	url: string;
	result: PostResult;
	at: string;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Walks an accepted message through queued -> sent -> delivered (or undelivered), posting a
 * signed status callback at each step as the provider does.
 */
export async function deliver(
	store: SmsStore,
	m: FakeMessage,
	authToken: string,
	log: CallbackRecord[],
	undelivered: boolean
) {
	const steps: { status: FakeStatus; error?: { code: number; message: string } }[] = [
		{ status: 'sent' },
		undelivered
			? {
					status: 'undelivered',
					error: { code: 30003, message: 'Unreachable destination handset' }
				}
			: { status: 'delivered' }
	];
	for (const step of steps) {
		await sleep(store.behaviour.callbackDelayMs);
		store.setStatus(m.sid, step.status, step.error);
		if (!m.statusCallback || Math.random() < store.behaviour.callbackDropRate) continue;
		const params: Record<string, string> = {
			AccountSid: m.accountSid,
			ApiVersion: '2010-04-01',
			From: m.from,
			To: m.to,
			MessageSid: m.sid,
			SmsSid: m.sid,
			MessageStatus: step.status,
			SmsStatus: step.status
		};
		if (step.error) params.ErrorCode = String(step.error.code);
		const result = await postSigned(m.statusCallback, params, authToken);
		log.push({
			sid: m.sid,
			status: step.status,
			url: m.statusCallback,
			result,
			at: new Date().toISOString()
		});
		if (log.length > 20_000) log.splice(0, log.length - 20_000);
	}
}

/** The texts of the <Message> elements in a TwiML reply. */
export function twimlMessages(xml: string): string[] {
	const out: string[] = [];
	for (const m of xml.matchAll(/<Message(?:\s[^>]*)?>([\s\S]*?)<\/Message>/g)) {
		out.push(
			m[1]
				.replace(/<Body>|<\/Body>/g, '')
				.replace(/&lt;/g, '<')
				.replace(/&gt;/g, '>')
				.replace(/&quot;/g, '"')
				.replace(/&apos;/g, "'")
				.replace(/&amp;/g, '&')
				.trim()
		);
	}
	return out;
}

import { randomBytes } from 'node:crypto';

export type FakeStatus =
	'accepted' | 'queued' | 'sending' | 'sent' | 'delivered' | 'undelivered' | 'failed' | 'received';

export interface FakeMessage {
	sid: string;
	accountSid: string;
	direction: 'outbound-api' | 'outbound-reply' | 'inbound';
	from: string;
	to: string;
	body: string;
	status: FakeStatus;
	errorCode: number | null;
	errorMessage: string | null;
	statusCallback: string | null;
	dateCreated: Date;
	dateSent: Date | null;
	dateUpdated: Date;
}

/** How the fake misbehaves; shares are 0..1 and drawn per message. */
export interface FakeBehaviour {
	/** Share of create calls answered 503, so no message exists. */
	failRate: number;
	/** Share of accepted messages that later report `undelivered` (carrier refused). */
	undeliveredRate: number;
	/** Share of create calls held `hangMs` before the answer (the message is created). */
	hangRate: number;
	hangMs: number;
	/** Added to every create call. */
	latencyMs: number;
	/** Between status callbacks (queued -> sent -> delivered). */
	callbackDelayMs: number;
	/** Share of status callbacks never posted (a webhook lost on the way); the status still moves. */
	callbackDropRate: number;
}

export const DEFAULT_BEHAVIOUR: FakeBehaviour = {
	failRate: 0,
	undeliveredRate: 0,
	hangRate: 0,
	hangMs: 15_000,
	latencyMs: 0,
	callbackDelayMs: 100,
	callbackDropRate: 0
};

/** Messages the fake holds, newest first by number; kept in memory for the process's life. */
export class SmsStore {
	private bySid = new Map<string, FakeMessage>();
	private order: FakeMessage[] = [];
	behaviour: FakeBehaviour = { ...DEFAULT_BEHAVIOUR };

	static newSid(prefix = 'SM') {
		return prefix + randomBytes(16).toString('hex');
	}

	add(m: Omit<FakeMessage, 'sid' | 'dateCreated' | 'dateUpdated' | 'dateSent'>): FakeMessage {
		const now = new Date();
		const msg: FakeMessage = {
			...m,
			sid: SmsStore.newSid(),
			dateCreated: now,
			dateUpdated: now,
			dateSent: null
		};
		this.bySid.set(msg.sid, msg);
		this.order.push(msg);
		return msg;
	}

	get(sid: string) {
		return this.bySid.get(sid);
	}

	setStatus(sid: string, status: FakeStatus, error?: { code: number; message: string }) {
		const m = this.bySid.get(sid);
		if (!m) return;
		m.status = status;
		m.dateUpdated = new Date();
		if (status === 'sent' || status === 'delivered') m.dateSent ??= m.dateUpdated;
		if (error) {
			m.errorCode = error.code;
			m.errorMessage = error.message;
		}
	}

	/** Newest first; `number` matches either end of the conversation. */
	list(filter: { to?: string; from?: string; number?: string } = {}): FakeMessage[] {
		const out: FakeMessage[] = [];
		for (let i = this.order.length - 1; i >= 0; i--) {
			const m = this.order[i];
			if (filter.to && m.to !== filter.to) continue;
			if (filter.from && m.from !== filter.from) continue;
			if (filter.number && m.to !== filter.number && m.from !== filter.number) continue;
			out.push(m);
		}
		return out;
	}

	numbers(): { number: string; count: number; last: Date }[] {
		const seen = new Map<string, { number: string; count: number; last: Date }>();
		for (const m of this.order) {
			const n = m.direction === 'inbound' ? m.from : m.to;
			const e = seen.get(n) ?? { number: n, count: 0, last: m.dateCreated };
			e.count++;
			e.last = m.dateCreated;
			seen.set(n, e);
		}
		return [...seen.values()].sort((a, b) => b.last.getTime() - a.last.getTime());
	}

	reset() {
		this.bySid.clear();
		this.order = [];
		this.behaviour = { ...DEFAULT_BEHAVIOUR };
	}
}

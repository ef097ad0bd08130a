import { Op, QueryTypes, type Transaction } from 'sequelize';
import type { Channel } from '../../domain';
import { Notification } from '../db/models';
import type { Composed } from './compose';
import { releaseAfterQuiet } from './quiet';
import type { Recipient } from './recipients';

export interface OutboxRow {
	organisationId: number;
	userId: number;
	blockId: number | null;
	recommendationId: number | null;
	channel: Channel;
	kind: string;
	dedupeKey: string;
	toAddress: string;
	subject: string | null;
	bodyText: string;
	bodyHtml: string | null;
	status: 'pending' | 'suppressed';
	notBefore: Date;
	lastError: string | null;
}

export interface RowContext {
	organisationId: number;
	blockId: number | null;
	recommendationId: number | null;
	kind: string;
	/** Key without person and channel; those are appended. */
	dedupeBase: string;
	now: Date;
	timeZone: string;
	/** Top-level alerts go out at once, quiet hours or not. */
	urgent: boolean;
	optedOut: Set<string>;
}

/** One outbox row per recipient and channel; SMS honours quiet hours and opt-outs. */
export function rowFor(r: Recipient, msg: Composed, c: RowContext): OutboxRow | null {
	const base = {
		organisationId: c.organisationId,
		userId: r.userId,
		blockId: c.blockId,
		recommendationId: c.recommendationId,
		kind: c.kind,
		dedupeKey: `${c.dedupeBase}:u${r.userId}:${r.channel}`,
		lastError: null as string | null
	};
	if (r.channel === 'sms') {
		if (!r.phone) return null;
		const stopped = c.optedOut.has(r.phone);
		return {
			...base,
			channel: 'sms',
			toAddress: r.phone,
			subject: null,
			bodyText: msg.sms,
			bodyHtml: null,
			status: stopped ? 'suppressed' : 'pending',
			lastError: stopped ? 'The number replied STOP; no SMS until it replies START.' : null,
			notBefore: c.urgent ? c.now : releaseAfterQuiet(c.now, c.timeZone, r.quietStart, r.quietEnd)
		};
	}
	return {
		...base,
		channel: 'email',
		toAddress: r.email,
		subject: msg.subject.slice(0, 300),
		bodyText: msg.text,
		bodyHtml: msg.html,
		status: 'pending',
		notBefore: c.now
	};
}

/**
 * Writes outbox rows in the caller's transaction and returns how many went in. A row whose
 * dedupe key exists is skipped (INSERT IGNORE), so a repeat of the same event never queues a
 * second message, and two sweeps that race count each row once between them.
 */
export async function writeRows(rows: OutboxRow[], t?: Transaction): Promise<number> {
	if (!rows.length) return 0;
	const sequelize = Notification.sequelize!;
	// ROW_COUNT() reads the statement before it on the same connection, which a transaction pins.
	if (!t) return sequelize.transaction((own) => writeRows(rows, own));
	await Notification.bulkCreate(rows, { transaction: t, ignoreDuplicates: true });
	const [{ n }] = await sequelize.query<{ n: number | bigint }>('SELECT ROW_COUNT() AS n', {
		type: QueryTypes.SELECT,
		transaction: t
	});
	return Number(n);
}

/** People and channels already alerted for this block and kind since `since` (not failed). */
export async function alertedSince(blockId: number, kind: string, since: Date, t?: Transaction) {
	return (await alertedSinceMany([{ blockId, kind }], since, t)).get(`${blockId}:${kind}`)!;
}

/** `alertedSince` for several blocks and kinds in one query, by `blockId:kind`. */
export async function alertedSinceMany(
	wanted: { blockId: number; kind: string }[],
	since: Date,
	t?: Transaction
): Promise<Map<string, Set<string>>> {
	const out = new Map(wanted.map((w) => [`${w.blockId}:${w.kind}`, new Set<string>()]));
	if (!wanted.length) return out;
	const rows = await Notification.findAll({
		attributes: ['blockId', 'kind', 'userId', 'channel'],
		where: {
			[Op.or]: wanted.map((w) => ({ blockId: w.blockId, kind: w.kind })),
			createdAt: { [Op.gt]: since },
			status: { [Op.notIn]: ['failed', 'undelivered'] }
		},
		transaction: t
	});
	for (const r of rows) out.get(`${r.blockId}:${r.kind}`)?.add(`${r.userId}:${r.channel}`);
	return out;
}

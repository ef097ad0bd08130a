import { QueryTypes, type Transaction } from 'sequelize';
import type { Channel } from '../../domain';
import { Notification } from '../db/models';
import { sqlTime } from '../db/sql';
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

/** The outbox's columns as `writeRows` fills them, each with its value for a row. */
const OUTBOX_COLUMNS: [string, (r: OutboxRow, now: string) => unknown][] = [
	['organisation_id', (r) => r.organisationId],
	['user_id', (r) => r.userId],
	['block_id', (r) => r.blockId],
	['recommendation_id', (r) => r.recommendationId],
	['channel', (r) => r.channel],
	['kind', (r) => r.kind],
	['dedupe_key', (r) => r.dedupeKey],
	['to_address', (r) => r.toAddress],
	['subject', (r) => r.subject],
	['body_text', (r) => r.bodyText],
	['body_html', (r) => r.bodyHtml],
	['status', (r) => r.status],
	['attempts', () => 0],
	['not_before', (r) => sqlTime(r.notBefore)],
	['last_error', (r) => r.lastError],
	['created_at', (_, now) => now],
	['updated_at', (_, now) => now]
];

/**
 * Writes outbox rows in the caller's transaction and returns how many went in. A row whose
 * dedupe key exists is skipped (INSERT IGNORE), so a repeat of the same event never queues a
 * second message, and two sweeps that race count each row once between them.
 */
export async function writeRows(rows: OutboxRow[], t?: Transaction): Promise<number> {
	if (!rows.length) return 0;
	// One plain statement: the model layer builds and validates an instance per row first,
	// which cost more than the insert for a batch of visits' alerts. INSERT IGNORE's affected
	// rows are the rows that went in.
	const now = sqlTime(new Date());
	const tuple = `(${OUTBOX_COLUMNS.map(() => '?').join(', ')})`;
	const [, inserted] = await Notification.sequelize!.query(
		`INSERT IGNORE INTO notifications (${OUTBOX_COLUMNS.map(([c]) => c).join(', ')})
		 VALUES ${rows.map(() => tuple).join(', ')}`,
		{
			replacements: rows.flatMap((r) => OUTBOX_COLUMNS.map(([, value]) => value(r, now))),
			type: QueryTypes.INSERT,
			transaction: t
		}
	);
	return Number(inserted);
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
	// Blocks and kinds as two lists; the pairs are picked out below.
	const rows = await Notification.sequelize!.query<{
		blockId: number;
		kind: string;
		userId: number;
		channel: string;
	}>(
		`SELECT block_id AS blockId, kind, user_id AS userId, channel FROM notifications
		  WHERE block_id IN (?) AND kind IN (?) AND created_at > ?
		    AND status NOT IN ('failed', 'undelivered')`,
		{
			replacements: [
				[...new Set(wanted.map((w) => w.blockId))],
				[...new Set(wanted.map((w) => w.kind))],
				sqlTime(since)
			],
			type: QueryTypes.SELECT,
			transaction: t
		}
	);
	for (const r of rows) out.get(`${r.blockId}:${r.kind}`)?.add(`${r.userId}:${r.channel}`);
	return out;
}

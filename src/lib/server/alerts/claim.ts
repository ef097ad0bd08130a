import { QueryTypes, Transaction, type Sequelize } from 'sequelize';
import type { Channel } from '../../domain';

export interface ClaimedRow {
	id: number;
	channel: Channel;
	toAddress: string;
	subject: string | null;
	bodyText: string;
	bodyHtml: string | null;
	/** Attempts including the one just claimed. */
	attempts: number;
	/** When the previous attempt was claimed, if any. */
	previousClaimAt: Date | null;
	/** The previous attempt may have reached the provider (no answer, or its worker died). */
	uncertain: boolean;
}

interface Raw {
	id: number | string;
	channel: Channel;
	to_address: string;
	subject: string | null;
	body_text: string;
	body_html: string | null;
	attempts: number;
	status: string;
	claimed_at: Date | null;
	last_error: string | null;
}

const COLS =
	'id, channel, to_address, subject, body_text, body_html, attempts, status, claimed_at, last_error';

/** Marks the error of an attempt whose outcome is unknown, so the next one checks first. */
export const NO_ANSWER = 'No answer from the provider';

/**
 * Claims up to `limit` due rows for worker `me`: rows whose lease ran out (their worker died)
 * first, then pending rows by due time. `FOR UPDATE SKIP LOCKED` in a short READ COMMITTED
 * transaction, so workers side by side never claim the same row and never wait on each other.
 */
export async function claimBatch(
	sequelize: Sequelize,
	me: string,
	limit: number,
	leaseMs: number
): Promise<ClaimedRow[]> {
	return sequelize.transaction(
		{ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED },
		async (t) => {
			const stale = await sequelize.query<Raw>(
				`SELECT ${COLS} FROM notifications
				  WHERE status = 'sending' AND claimed_at < NOW(3) - INTERVAL :lease MICROSECOND
				  ORDER BY claimed_at, id LIMIT :limit FOR UPDATE SKIP LOCKED`,
				{ replacements: { lease: leaseMs * 1000, limit }, type: QueryTypes.SELECT, transaction: t }
			);
			const due =
				stale.length < limit
					? await sequelize.query<Raw>(
							`SELECT ${COLS} FROM notifications
							  WHERE status = 'pending' AND not_before <= NOW(3)
							  ORDER BY not_before, id LIMIT :limit FOR UPDATE SKIP LOCKED`,
							{
								replacements: { limit: limit - stale.length },
								type: QueryTypes.SELECT,
								transaction: t
							}
						)
					: [];
			const rows = [...stale, ...due];
			if (!rows.length) return [];
			await sequelize.query(
				`UPDATE notifications SET status = 'sending', claimed_by = :me, claimed_at = NOW(3),
				        attempts = attempts + 1, updated_at = NOW(3)
				  WHERE id IN (:ids)`,
				{ replacements: { me, ids: rows.map((r) => r.id) }, transaction: t }
			);
			return rows.map((r) => ({
				id: Number(r.id),
				channel: r.channel,
				toAddress: r.to_address,
				subject: r.subject,
				bodyText: r.body_text,
				bodyHtml: r.body_html,
				attempts: r.attempts + 1,
				previousClaimAt: r.claimed_at ? new Date(r.claimed_at) : null,
				uncertain: r.status === 'sending' || !!r.last_error?.startsWith(NO_ANSWER)
			}));
		}
	);
}

export type Outcome =
	| { kind: 'sent'; providerId: string; delivered?: boolean }
	| { kind: 'retry'; error: string }
	| { kind: 'failed'; error: string }
	| { kind: 'suppressed'; error: string };

/** Exponential backoff with jitter: base x 2^(attempt-1), capped, times 0.5 to 1. */
export function backoffMs(attempt: number, baseMs: number, maxMs: number, rnd = Math.random) {
	const raw = Math.min(maxMs, baseMs * 2 ** Math.max(0, attempt - 1));
	return Math.round(raw * (0.5 + rnd() * 0.5));
}

/**
 * Records one row's outcome, only while `me` still holds this very attempt: a status callback
 * may already have handed the row back (undelivered) and this worker claimed it again, and the
 * late outcome of the old attempt must not overwrite the new one. A status callback that
 * already moved a sent SMS on (delivered) is kept.
 */
export async function recordOutcome(
	sequelize: Sequelize,
	me: string,
	row: ClaimedRow,
	o: Outcome,
	retry: { maxAttempts: number; baseMs: number; maxMs: number }
) {
	const where = 'WHERE id = :id AND claimed_by = :me AND attempts = :attempt';
	const r = { id: row.id, me, attempt: row.attempts };
	if (o.kind === 'sent') {
		await sequelize.query(
			`UPDATE notifications SET provider_id = :pid, sent_at = COALESCE(sent_at, NOW(3)), last_error = NULL,
			        claimed_by = NULL, updated_at = NOW(3),
			        delivered_at = IF(:delivered AND status IN ('sending', 'sent'), NOW(3), delivered_at),
			        status = CASE WHEN status IN ('sending', 'sent') AND :delivered THEN 'delivered'
			                      WHEN status = 'sending' THEN 'sent' ELSE status END ${where}`,
			{ replacements: { ...r, pid: o.providerId.slice(0, 80), delivered: !!o.delivered } }
		);
		return;
	}
	if (o.kind === 'retry' && row.attempts < retry.maxAttempts) {
		const delay = backoffMs(row.attempts, retry.baseMs, retry.maxMs);
		await sequelize.query(
			`UPDATE notifications SET status = 'pending', not_before = NOW(3) + INTERVAL :delay MICROSECOND,
			        last_error = :err, claimed_by = NULL, updated_at = NOW(3) ${where} AND status = 'sending'`,
			{ replacements: { ...r, delay: delay * 1000, err: o.error.slice(0, 500) } }
		);
		return;
	}
	const status = o.kind === 'suppressed' ? 'suppressed' : 'failed';
	const err =
		o.kind === 'retry' ? `Gave up after ${row.attempts} attempts. Last error: ${o.error}` : o.error;
	await sequelize.query(
		`UPDATE notifications SET status = :status, last_error = :err, claimed_by = NULL, updated_at = NOW(3)
		  ${where} AND status = 'sending'`,
		{ replacements: { ...r, status, err: err.slice(0, 500) } }
	);
}

/** Hands an unsent row back to the queue, as if this claim had not happened. */
export async function releaseClaim(sequelize: Sequelize, me: string, row: ClaimedRow) {
	await sequelize.query(
		`UPDATE notifications SET status = 'pending', attempts = attempts - 1, claimed_by = NULL,
		        claimed_at = :prev, updated_at = NOW(3)
		  WHERE id = :id AND claimed_by = :me AND status = 'sending'`,
		{ replacements: { id: row.id, me, prev: row.previousClaimAt } }
	);
}

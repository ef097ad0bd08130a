import { QueryTypes, type Sequelize } from 'sequelize';
import { z } from 'zod';
import { backoffMs } from './claim';
import type { AlertSettings } from './settings';

export const statusCallbackSchema = z.object({
	MessageSid: z.string().regex(/^(SM|MM)[0-9a-f]{32}$/, 'MessageSid: not a message id'),
	MessageStatus: z.string().min(1, 'MessageStatus: required'),
	ErrorCode: z.string().optional()
});
export type StatusCallback = z.infer<typeof statusCallbackSchema>;

const q = (sq: Sequelize, sql: string, replacements: Record<string, unknown>) =>
	sq.query(sql, { replacements, type: QueryTypes.UPDATE }) as unknown as Promise<[unknown, number]>;

/**
 * Applies one signed status callback to its outbox row (`n`) and attempt (`a`). Idempotent and
 * order-proof: a status only moves a row forward, a callback for an older attempt or another
 * message id changes nothing, and a delivery failure queues a new attempt while any are left.
 * Returns whether the row changed.
 */
export async function applyStatus(
	sq: Sequelize,
	s: AlertSettings,
	id: number,
	attempt: number,
	cb: StatusCallback
): Promise<boolean> {
	// The message id decides; the attempt only guards adopting an id the worker has not yet
	// recorded (a late callback of an older attempt must not claim a newer one).
	const match = `id = :id AND channel = 'sms'
	  AND (provider_id = :sid OR (provider_id IS NULL AND status = 'sending' AND attempts = :a))`;
	const r = { id, a: attempt, sid: cb.MessageSid };
	let res: [unknown, number];
	switch (cb.MessageStatus) {
		case 'sent':
			res = await q(
				sq,
				`UPDATE notifications SET status = 'sent', provider_id = :sid, sent_at = COALESCE(sent_at, NOW(3)),
				        updated_at = NOW(3) WHERE ${match} AND status = 'sending'`,
				r
			);
			break;
		case 'delivered':
			res = await q(
				sq,
				`UPDATE notifications SET status = 'delivered', provider_id = :sid, sent_at = COALESCE(sent_at, NOW(3)),
				        delivered_at = NOW(3), updated_at = NOW(3) WHERE ${match} AND status IN ('sending', 'sent')`,
				r
			);
			break;
		case 'undelivered':
		case 'failed': {
			const err = `Provider reported ${cb.MessageStatus}${cb.ErrorCode ? ` (code ${cb.ErrorCode})` : ''} for ${cb.MessageSid}`;
			const delay = backoffMs(attempt, s.ALERTS_BACKOFF_MS, s.ALERTS_BACKOFF_MAX_MS) * 1000;
			res = await q(
				sq,
				`UPDATE notifications SET
				        status = IF(attempts < :max, 'pending', :final),
				        not_before = IF(attempts < :max, NOW(3) + INTERVAL :delay MICROSECOND, not_before),
				        provider_id = IF(attempts < :max, NULL, :sid),
				        last_error = IF(attempts < :max, :err, CONCAT('Gave up after ', attempts, ' attempts. ', :err)),
				        claimed_by = NULL, updated_at = NOW(3)
				  WHERE ${match} AND status IN ('sending', 'sent')`,
				{ ...r, max: s.ALERTS_MAX_ATTEMPTS, final: cb.MessageStatus, delay, err }
			);
			break;
		}
		default:
			return false; // queued, sending, accepted and the like add nothing we keep
	}
	return res[1] > 0;
}

import { QueryTypes, Transaction, type Sequelize } from 'sequelize';
import type { AlertSettings } from './settings';
import type { SmsClient } from './sms';
import { applyStatus } from './status';

interface Row {
	id: number | string;
	attempts: number;
	provider_id: string;
}

const FINAL = new Set(['delivered', 'undelivered', 'failed']);

/**
 * Status callbacks can be lost (our endpoint down, a network fault). An SMS still `sent` this
 * long after its last change is asked about at the provider and moved on as its callback would
 * have moved it: delivered, or back to the queue when the carrier refused it. Rows are taken
 * with SKIP LOCKED and stamped, so workers side by side share the checks and a row the provider
 * still calls `sent` waits another interval. Texts older than three days are left as they are.
 * Returns how many rows changed.
 */
export async function checkUnconfirmed(
	sq: Sequelize,
	client: SmsClient,
	s: AlertSettings,
	limit = 50
): Promise<number> {
	const rows = await sq.transaction(
		{ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED },
		async (t) => {
			const due = await sq.query<Row>(
				`SELECT id, attempts, provider_id FROM notifications
				  WHERE channel = 'sms' AND status = 'sent' AND provider_id IS NOT NULL
				    AND updated_at < NOW(3) - INTERVAL :after MICROSECOND
				    AND sent_at > NOW(3) - INTERVAL 3 DAY
				  ORDER BY updated_at, id LIMIT :limit FOR UPDATE SKIP LOCKED`,
				{
					replacements: { after: s.ALERTS_STATUS_CHECK_MS * 1000, limit },
					type: QueryTypes.SELECT,
					transaction: t
				}
			);
			if (due.length)
				await sq.query(`UPDATE notifications SET updated_at = NOW(3) WHERE id IN (:ids)`, {
					replacements: { ids: due.map((r) => r.id) },
					transaction: t
				});
			return due;
		}
	);
	let changed = 0;
	for (const r of rows) {
		try {
			const m = await client.messages(r.provider_id).fetch();
			if (!FINAL.has(m.status)) continue;
			const moved = await applyStatus(sq, s, Number(r.id), r.attempts, {
				MessageSid: m.sid,
				MessageStatus: m.status,
				ErrorCode: m.errorCode == null ? undefined : String(m.errorCode)
			});
			if (moved) changed++;
		} catch {
			// The provider did not answer: these rows stay `sent` and are asked about next
			// interval; the rest wait too, so a hanging provider costs one timeout, not fifty.
			break;
		}
	}
	return changed;
}

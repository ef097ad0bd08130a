import { hostname } from 'node:os';
import type { Transporter } from 'nodemailer';
import { NO_ANSWER, type ClaimedRow, type Outcome } from './claim';
import { PERMANENT_SMS_CODES, statusCallbackUrl, type SmsClient } from './sms';
import type { AlertSettings } from './settings';

interface ProviderError {
	status?: number;
	code?: number;
	message?: string;
}

const isRestError = (e: unknown): e is ProviderError =>
	typeof e === 'object' && e !== null && typeof (e as ProviderError).status === 'number';

/** Clock skew allowed between us and the provider when matching an earlier attempt. */
const SKEW_MS = 5_000;

/**
 * Sends one SMS row. When an earlier attempt may have reached the provider (no answer, or its
 * worker died mid-batch), it first asks the provider for a message with the same number and
 * text created since that attempt, and adopts it instead of sending a second one.
 */
export async function sendSms(
	client: SmsClient,
	s: AlertSettings,
	row: ClaimedRow
): Promise<Outcome> {
	try {
		if (row.uncertain && row.previousClaimAt) {
			const since = row.previousClaimAt.getTime() - SKEW_MS;
			const earlier = await client.messages.list({
				to: row.toAddress,
				from: s.TWILIO_FROM,
				limit: 50
			});
			const same = earlier.find(
				(m) =>
					m.body === row.bodyText &&
					m.dateCreated.getTime() >= since &&
					m.status !== 'failed' &&
					m.status !== 'undelivered'
			);
			// Its callbacks may have come while the row waited for this retry and matched nothing,
			// so the status the provider holds now is the one to keep.
			if (same)
				return { kind: 'sent', providerId: same.sid, delivered: same.status === 'delivered' };
		}
		const m = await client.messages.create({
			to: row.toAddress,
			from: s.TWILIO_FROM,
			body: row.bodyText,
			statusCallback: statusCallbackUrl(s, row.id, row.attempts)
		});
		return { kind: 'sent', providerId: m.sid };
	} catch (e) {
		if (isRestError(e)) {
			const what = `Provider refused (HTTP ${e.status}${e.code ? `, code ${e.code}` : ''}): ${e.message ?? ''}`;
			const permanent =
				PERMANENT_SMS_CODES.has(e.code ?? 0) ||
				(e.status! >= 400 && e.status! < 500 && e.status !== 429);
			return permanent ? { kind: 'failed', error: what } : { kind: 'retry', error: what };
		}
		return { kind: 'retry', error: `${NO_ANSWER}: ${(e as Error).message}` };
	}
}

const host = hostname();

/** Sends one e-mail row; the Message-ID is fixed per row so a receiver can spot a repeat. */
export async function sendMail(
	mail: Transporter,
	s: AlertSettings,
	row: ClaimedRow
): Promise<Outcome> {
	try {
		const info = await mail.sendMail({
			from: s.MAIL_FROM,
			to: row.toAddress,
			subject: row.subject ?? 'Cornicle alert',
			text: row.bodyText,
			html: row.bodyHtml ?? undefined,
			messageId: `<alert-${row.id}@${host}.cornicle>`,
			headers: { 'X-Cornicle-Alert': String(row.id) }
		});
		return { kind: 'sent', providerId: info.messageId ?? `alert-${row.id}` };
	} catch (e) {
		const err = e as Error & { responseCode?: number };
		const what = `Mail server: ${err.message}`;
		return err.responseCode && err.responseCode >= 500
			? { kind: 'failed', error: what }
			: { kind: 'retry', error: what };
	}
}

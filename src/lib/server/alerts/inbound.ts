import { QueryTypes, type Sequelize } from 'sequelize';
import { z } from 'zod';
import { AuditLog, Recommendation } from '../db/models';
import type { AlertSettings } from './settings';

export const inboundSchema = z.object({
	From: z.string().regex(/^\+[1-9]\d{6,14}$/, 'From: not an E.164 number'),
	Body: z.string().max(1600, 'Body: too long').default('')
});
export type Inbound = z.infer<typeof inboundSchema>;

// Carrier opt-out and help keywords (CTIA short-code handbook, as the provider applies them
// by default; list from memory of the provider's docs).
const STOP = new Set([
	'STOP',
	'STOPALL',
	'STOP ALL',
	'UNSUBSCRIBE',
	'CANCEL',
	'END',
	'QUIT',
	'OPTOUT',
	'REVOKE'
]);
const START = new Set(['START', 'UNSTOP', 'YES']);
const HELP = new Set(['HELP', 'INFO']);
/** Replies that acknowledge the grower's latest open recommendation. */
export const ACK_WORDS = new Set([
	'OK',
	'OKAY',
	'ACK',
	'ACKNOWLEDGE',
	'ACKNOWLEDGED',
	'RECEIVED',
	'NOTED',
	'GOT IT'
]);

export const REPLIES = {
	stop: 'Cornicle: you are unsubscribed and will get no more texts. Reply START to resubscribe.',
	start:
		'Cornicle: you are subscribed to field alerts again. Reply STOP to unsubscribe, HELP for help.',
	help: (base: string) =>
		`Cornicle field alerts: block pressure and recommendations. Msg frequency varies. Reply STOP to unsubscribe, OK to acknowledge. Help: ${base}`,
	unknown:
		'Cornicle: reply OK to acknowledge your latest recommendation, HELP for help, STOP to unsubscribe.'
};

export function keyword(body: string) {
	return body
		.trim()
		.toUpperCase()
		.replace(/[.!?,]+$/, '')
		.replace(/\s+/g, ' ');
}

/**
 * Handles an inbound text: STOP / START / HELP as carriers require (the opt-out is stored and
 * applies at once: queued SMS to the number are suppressed), and an acknowledgement word
 * acknowledges the sender's latest issued recommendation. Returns the reply, or null.
 */
export async function handleInbound(
	sq: Sequelize,
	s: AlertSettings,
	msg: Inbound
): Promise<string | null> {
	const word = keyword(msg.Body);
	if (STOP.has(word)) {
		await sq.transaction(async (t) => {
			await sq.query(
				'INSERT INTO sms_opt_outs (phone_e164, opted_out_at) VALUES (:p, NOW()) ON DUPLICATE KEY UPDATE opted_out_at = opted_out_at',
				{ replacements: { p: msg.From }, transaction: t }
			);
			await sq.query(
				`UPDATE notifications SET status = 'suppressed', last_error = 'The number replied STOP.', updated_at = NOW(3)
				  WHERE channel = 'sms' AND to_address = :p AND status = 'pending'`,
				{ replacements: { p: msg.From }, transaction: t }
			);
		});
		return REPLIES.stop;
	}
	if (START.has(word)) {
		await sq.query('DELETE FROM sms_opt_outs WHERE phone_e164 = :p', {
			replacements: { p: msg.From }
		});
		return REPLIES.start;
	}
	if (HELP.has(word)) return REPLIES.help(s.PUBLIC_BASE_URL);
	const [stopped] = await sq.query('SELECT 1 FROM sms_opt_outs WHERE phone_e164 = :p', {
		replacements: { p: msg.From },
		type: QueryTypes.SELECT
	});
	if (ACK_WORDS.has(word)) {
		const done = await acknowledgeLatest(sq, msg.From);
		if (stopped) return null;
		return done
			? `Cornicle: thank you, the recommendation for ${done.block} is acknowledged.`
			: 'Cornicle: there is no open recommendation to acknowledge.';
	}
	return stopped ? null : REPLIES.unknown;
}

/** Acknowledges the latest issued recommendation on farms of the grower with this number. */
async function acknowledgeLatest(sq: Sequelize, phone: string) {
	return sq.transaction(async (t) => {
		const [rec] = await sq.query<{ id: number; block: string; growerId: number; org: number }>(
			`SELECT r.id, b.name AS block, u.id AS growerId, r.organisation_id AS org
			   FROM recommendations r JOIN blocks b ON b.id = r.block_id JOIN farms f ON f.id = b.farm_id
			   JOIN users u ON u.id = f.grower_id
			   JOIN memberships m ON m.user_id = u.id AND m.organisation_id = r.organisation_id AND m.role = 'grower'
			  WHERE u.phone_e164 = :phone AND r.status = 'issued'
			  ORDER BY r.issued_at DESC, r.id DESC LIMIT 1 FOR UPDATE`,
			{ replacements: { phone }, type: QueryTypes.SELECT, transaction: t }
		);
		if (!rec) return null;
		await Recommendation.update(
			{ status: 'acknowledged', acknowledgedAt: new Date(), acknowledgedBy: rec.growerId },
			{ where: { id: rec.id, status: 'issued' }, transaction: t }
		);
		await AuditLog.create(
			{
				organisationId: rec.org,
				actorId: rec.growerId,
				action: 'recommendation-acknowledged',
				entity: 'recommendation',
				entityId: String(rec.id),
				details: { via: 'sms' }
			},
			{ transaction: t }
		);
		return rec;
	});
}

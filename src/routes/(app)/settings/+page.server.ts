import { QueryTypes } from 'sequelize';
import { db } from '$lib/server/db';
import { requireRole } from '$lib/server/guard';
import { ROLES } from '$lib/roles';
import type { PageServerLoad } from './$types';

interface Row {
	id: number;
	channel: 'sms' | 'email';
	minLevel: string;
	quietStart: string | null;
	quietEnd: string | null;
	active: number;
	farm: string | null;
	block: string | null;
}

/** The signed-in person's own alert subscriptions and the address each goes to. */
export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ...ROLES);
	const [rows, [me], [optOut]] = await Promise.all([
		db().query<Row>(
			`SELECT s.id, s.channel, s.min_level AS minLevel, s.quiet_start AS quietStart,
			        s.quiet_end AS quietEnd, s.active, f.name AS farm, b.name AS block
			   FROM subscriptions s
			   LEFT JOIN farms f ON f.id = s.farm_id AND f.organisation_id = ?
			   LEFT JOIN blocks b ON b.id = s.block_id AND b.organisation_id = ?
			  WHERE s.user_id = ? ORDER BY s.channel, s.id`,
			{ replacements: [user.organisationId, user.organisationId, user.id], type: QueryTypes.SELECT }
		),
		db().query<{ email: string; phone: string | null }>(
			`SELECT email, phone_e164 AS phone FROM users WHERE id = ?`,
			{ replacements: [user.id], type: QueryTypes.SELECT }
		),
		db().query<{ n: number }>(
			`SELECT COUNT(*) AS n FROM sms_opt_outs o JOIN users u ON u.phone_e164 = o.phone_e164 WHERE u.id = ?`,
			{ replacements: [user.id], type: QueryTypes.SELECT }
		)
	]);
	return {
		subscriptions: rows.map((r) => ({ ...r, active: !!r.active })),
		email: me?.email ?? user.email,
		phone: me?.phone ?? null,
		smsStopped: Number(optOut?.n ?? 0) > 0
	};
};

import { QueryTypes, type Transaction } from 'sequelize';
import type { Channel } from '../../domain';
import type { LevelKey } from '../../engine';
import type { Role } from '../../roles';
import { Notification } from '../db/models';

export interface Recipient {
	userId: number;
	role: Role;
	name: string;
	email: string;
	phone: string | null;
	channel: Channel;
	minLevel: LevelKey;
	quietStart: string | null;
	quietEnd: string | null;
}

interface Row extends Recipient {
	specificity: number;
}

/**
 * Active subscriptions that cover a block, one per person and channel (the most specific wins:
 * block, then farm, then all blocks), limited to people who may see the block: the farm's
 * grower, the organisation's agronomists and admins, and scouts assigned to it.
 */
export async function recipientsForBlock(
	block: { id: number; farmId: number; organisationId: number },
	t: Transaction | undefined,
	onlyUserId?: number
): Promise<Recipient[]> {
	return (await recipientsForBlocks([block], t, onlyUserId)).get(block.id) ?? [];
}

/** `recipientsForBlock` for several blocks in one query, by block id. */
export async function recipientsForBlocks(
	blocks: { id: number; farmId: number; organisationId: number }[],
	t: Transaction | undefined,
	onlyUserId?: number
): Promise<Map<number, Recipient[]>> {
	const out = new Map<number, Recipient[]>(blocks.map((b) => [b.id, []]));
	if (!blocks.length) return out;
	const sequelize = Notification.sequelize!;
	const keys = blocks.map(() => 'SELECT ? AS block, ? AS farm, ? AS org').join(' UNION ALL ');
	const rows = await sequelize.query<Row & { blockId: number }>(
		`SELECT k.block AS blockId, s.user_id AS userId, m.role, u.name, u.email,
		        u.phone_e164 AS phone, s.channel, s.min_level AS minLevel,
		        s.quiet_start AS quietStart, s.quiet_end AS quietEnd,
		        (CASE WHEN s.block_id IS NOT NULL THEN 2 WHEN s.farm_id IS NOT NULL THEN 1 ELSE 0 END) AS specificity
		   FROM (${keys}) k
		   JOIN farms f ON f.id = k.farm
		   JOIN subscriptions s ON s.active = 1
		    AND (s.block_id = k.block OR (s.block_id IS NULL AND (s.farm_id = k.farm OR s.farm_id IS NULL)))
		   JOIN users u ON u.id = s.user_id
		   JOIN memberships m ON m.user_id = u.id AND m.organisation_id = k.org
		  WHERE (m.role IN ('agronomist', 'admin')
		         OR (m.role = 'grower' AND f.grower_id = u.id)
		         OR (m.role = 'scout' AND EXISTS (SELECT 1 FROM scouting_assignments a
		               WHERE a.block_id = k.block AND a.scout_id = u.id AND a.active = 1)))
		    ${onlyUserId ? 'AND s.user_id = ?' : ''}
		  ORDER BY k.block, s.user_id, s.channel, specificity DESC, s.id`,
		{
			replacements: [
				...blocks.flatMap((b) => [b.id, b.farmId, b.organisationId]),
				...(onlyUserId ? [onlyUserId] : [])
			],
			type: QueryTypes.SELECT,
			transaction: t
		}
	);
	const seen = new Set<string>();
	for (const r of rows) {
		const key = `${r.blockId}:${r.userId}:${r.channel}`;
		if (seen.has(key)) continue;
		seen.add(key);
		const { specificity: _s, blockId, ...rest } = r;
		void _s;
		out.get(Number(blockId))?.push(rest);
	}
	return out;
}

/** Numbers that replied STOP (and not START since), among `phones`. */
export async function optedOut(phones: string[], t?: Transaction): Promise<Set<string>> {
	if (!phones.length) return new Set();
	const rows = await Notification.sequelize!.query<{ p: string }>(
		'SELECT phone_e164 AS p FROM sms_opt_outs WHERE phone_e164 IN (:phones)',
		{ replacements: { phones }, type: QueryTypes.SELECT, transaction: t }
	);
	return new Set(rows.map((r) => r.p));
}

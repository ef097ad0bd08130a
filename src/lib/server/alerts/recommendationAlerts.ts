import type { Transaction } from 'sequelize';
import type { StoredResult } from '../assessments';
import { Assessment, Block, Farm, Organisation, Product, Recommendation, User } from '../db/models';
import { recommendationMessage } from './compose';
import { treatInfo } from './levelAlerts';
import { blockLink, settingsLink } from './links';
import { rowFor, writeRows, type OutboxRow } from './outbox';
import { optedOut, recipientsForBlock } from './recipients';
import { currentSettings } from './settings';

/** Outbox rows for an issued recommendation: to the block's grower, on each channel they chose. */
export async function queueRecommendationAlerts(
	recommendationId: number,
	t?: Transaction,
	now = new Date()
): Promise<number> {
	const s = currentSettings();
	const rec = await Recommendation.findByPk(recommendationId, {
		include: [{ model: Product, as: 'product' }],
		transaction: t
	});
	if (!rec) return 0;
	const block = await Block.findByPk(rec.blockId, { transaction: t });
	const farm = block ? await Farm.findByPk(block.farmId, { transaction: t }) : null;
	if (!block || !farm) return 0;
	const [org, author, latest, recipients] = await Promise.all([
		Organisation.findByPk(block.organisationId, { transaction: t }),
		User.findByPk(rec.authorId, { attributes: ['name'], transaction: t }),
		Assessment.findOne({
			where: { blockId: block.id },
			order: [
				['computedAt', 'DESC'],
				['id', 'DESC']
			],
			transaction: t
		}),
		recipientsForBlock(block, t, farm.growerId)
	]);
	if (!recipients.length) return 0;
	const stopped = await optedOut(
		recipients.flatMap((r) => (r.phone ? [r.phone] : [])),
		t
	);
	const rows: OutboxRow[] = [];
	for (const r of recipients) {
		const msg = recommendationMessage({
			block: block.name,
			farm: farm.name,
			decision: rec.decision,
			author: author?.name ?? 'Your agronomist',
			notes: rec.notes ?? null,
			rescoutBy: rec.rescoutBy ?? null,
			warnings: (rec.warnings ?? []).map((w) => w.message),
			treat: rec.decision === 'treat' ? treatInfo(rec) : null,
			assessment: (latest?.result as StoredResult | undefined) ?? null,
			link: blockLink(s, r.role, block.id),
			settingsUrl: settingsLink(s),
			smsAck: true
		});
		const row = rowFor(r, msg, {
			organisationId: block.organisationId,
			blockId: block.id,
			recommendationId: rec.id,
			kind: 'recommendation',
			dedupeBase: `rec:${rec.id}`,
			now,
			timeZone: org?.timezone ?? 'UTC',
			urgent: block.currentLevel === 'severe',
			optedOut: stopped
		});
		if (row) rows.push(row);
	}
	return writeRows(rows, t);
}

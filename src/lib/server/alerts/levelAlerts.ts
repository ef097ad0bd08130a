import { Op, type Transaction } from 'sequelize';
import { LEVEL_KEYS } from '../../domain';
import type { Assessment as EngineAssessment, LevelKey } from '../../engine';
import { Block, Farm, Organisation, Product, Recommendation } from '../db/models';
import { levelMessage, type TreatInfo } from './compose';
import { blockLink, settingsLink } from './links';
import { alertedSince, rowFor, writeRows, type OutboxRow } from './outbox';
import { optedOut, recipientsForBlock } from './recipients';
import { currentSettings } from './settings';

export const rank = (l: LevelKey | null) => (l ? LEVEL_KEYS.indexOf(l) : -1);

/** The block's open treat recommendation (issued or acknowledged), for its cautions. */
export async function openTreat(blockId: number, t?: Transaction): Promise<TreatInfo | null> {
	const rec = await Recommendation.findOne({
		where: { blockId, decision: 'treat', status: { [Op.in]: ['issued', 'acknowledged'] } },
		include: [{ model: Product, as: 'product' }],
		order: [['issuedAt', 'DESC']],
		transaction: t
	});
	return rec ? treatInfo(rec) : null;
}

export function treatInfo(rec: Recommendation): TreatInfo {
	const p = (rec as Recommendation & { product?: Product | null }).product ?? null;
	return {
		product: p?.name ?? null,
		iracGroup: p?.iracGroup ?? null,
		reiHours: p?.reiHours ?? null,
		phiDays: p?.phiDays ?? null,
		targetDate: rec.targetDate ?? null
	};
}

/**
 * Outbox rows for a block whose level rose: one per subscriber and channel whose lowest level
 * it reaches, none for a person already alerted for this block and level within the window.
 */
export async function queueLevelAlerts(
	block: Block,
	from: LevelKey | null,
	to: EngineAssessment,
	t?: Transaction,
	now = new Date()
): Promise<number> {
	if (rank(to.level) <= rank(from)) return 0;
	const s = currentSettings();
	const [farm, org, recipients] = await Promise.all([
		Farm.findByPk(block.farmId, { transaction: t }),
		Organisation.findByPk(block.organisationId, { transaction: t }),
		recipientsForBlock(block, t)
	]);
	const due = recipients.filter((r) => rank(to.level) >= rank(r.minLevel));
	if (!due.length || !farm) return 0;
	const kind = `level-${to.level}`;
	const windowMs = s.ALERTS_REPEAT_HOURS * 3_600_000;
	const [already, stopped, treat] = await Promise.all([
		windowMs
			? alertedSince(block.id, kind, new Date(now.getTime() - windowMs), t)
			: new Set<string>(),
		optedOut(
			due.flatMap((r) => (r.phone ? [r.phone] : [])),
			t
		),
		openTreat(block.id, t)
	]);
	const bucket = windowMs ? Math.floor(now.getTime() / windowMs) : now.getTime();
	const rows: OutboxRow[] = [];
	for (const r of due) {
		if (already.has(`${r.userId}:${r.channel}`)) continue;
		const msg = levelMessage({
			block: block.name,
			farm: farm.name,
			from,
			assessment: to,
			link: blockLink(s, r.role, block.id),
			settingsUrl: settingsLink(s),
			treat
		});
		const row = rowFor(r, msg, {
			organisationId: block.organisationId,
			blockId: block.id,
			recommendationId: null,
			kind,
			dedupeBase: `level:b${block.id}:${to.level}:w${bucket}`,
			now,
			timeZone: org?.timezone ?? 'UTC',
			urgent: to.level === 'severe',
			optedOut: stopped
		});
		if (row) rows.push(row);
	}
	return writeRows(rows, t);
}

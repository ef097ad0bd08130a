import { Op, QueryTypes, type Transaction } from 'sequelize';
import { LEVEL_KEYS } from '../../domain';
import type { Assessment as EngineAssessment, LevelKey } from '../../engine';
import { Block, Product, Recommendation } from '../db/models';
import { levelMessage, type TreatInfo } from './compose';
import { blockLink, settingsLink } from './links';
import { alertedSinceMany, rowFor, writeRows, type OutboxRow } from './outbox';
import { optedOut, recipientsForBlocks } from './recipients';
import { currentSettings } from './settings';

export const rank = (l: LevelKey | null) => (l ? LEVEL_KEYS.indexOf(l) : -1);

/** The block's open treat recommendation (issued or acknowledged), for its cautions. */
export async function openTreat(blockId: number, t?: Transaction): Promise<TreatInfo | null> {
	return (await openTreats([blockId], t)).get(blockId) ?? null;
}

/** `openTreat` for several blocks in one query. */
async function openTreats(blockIds: number[], t?: Transaction) {
	const recs = await Recommendation.findAll({
		where: {
			blockId: { [Op.in]: blockIds },
			decision: 'treat',
			status: { [Op.in]: ['issued', 'acknowledged'] }
		},
		include: [{ model: Product, as: 'product' }],
		order: [['issuedAt', 'DESC']],
		transaction: t
	});
	const out = new Map<number, TreatInfo>();
	for (const rec of recs) if (!out.has(rec.blockId)) out.set(rec.blockId, treatInfo(rec));
	return out;
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

export interface LevelRise {
	block: Block;
	from: LevelKey | null;
	to: EngineAssessment;
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
	return queueLevelAlertsMany([{ block, from, to }], t, now);
}

/**
 * `queueLevelAlerts` for several changes at once (a batch of visits), in the same handful of
 * queries as for one; changes that are not rises are passed over.
 */
export async function queueLevelAlertsMany(
	changes: LevelRise[],
	t?: Transaction,
	now = new Date()
): Promise<number> {
	const rises = changes.filter((c) => rank(c.to.level) > rank(c.from));
	if (!rises.length) return 0;
	const s = currentSettings();
	const blocks = [...new Map(rises.map((c) => [c.block.id, c.block])).values()];
	const [places, recipientsOf] = await Promise.all([
		Block.sequelize!.query<{ blockId: number; farm: string; timeZone: string }>(
			`SELECT b.id AS blockId, f.name AS farm, o.timezone AS timeZone
			   FROM blocks b JOIN farms f ON f.id = b.farm_id
			   JOIN organisations o ON o.id = b.organisation_id
			  WHERE b.id IN (?)`,
			{ replacements: [blocks.map((b) => b.id)], type: QueryTypes.SELECT, transaction: t }
		),
		recipientsForBlocks(blocks, t)
	]);
	const placeOf = new Map(places.map((p) => [Number(p.blockId), p]));
	const live = rises.flatMap((c) => {
		const place = placeOf.get(c.block.id);
		const due = (recipientsOf.get(c.block.id) ?? []).filter(
			(r) => rank(c.to.level) >= rank(r.minLevel)
		);
		return place && due.length ? [{ ...c, due, place }] : [];
	});
	if (!live.length) return 0;
	const windowMs = s.ALERTS_REPEAT_HOURS * 3_600_000;
	const kindOf = (c: LevelRise) => `level-${c.to.level}`;
	const already = windowMs
		? await alertedSinceMany(
				live.map((c) => ({ blockId: c.block.id, kind: kindOf(c) })),
				new Date(now.getTime() - windowMs),
				t
			)
		: new Map<string, Set<string>>();
	// Only people not alerted within the window get a message; most repeat rises stop here.
	const send = live
		.map((c) => {
			const alerted = already.get(`${c.block.id}:${kindOf(c)}`);
			return { ...c, due: c.due.filter((r) => !alerted?.has(`${r.userId}:${r.channel}`)) };
		})
		.filter((c) => c.due.length);
	if (!send.length) return 0;
	const [stopped, treats] = await Promise.all([
		optedOut(
			[...new Set(send.flatMap((c) => c.due.flatMap((r) => (r.phone ? [r.phone] : []))))],
			t
		),
		openTreats([...new Set(send.map((c) => c.block.id))], t)
	]);
	const bucket = windowMs ? Math.floor(now.getTime() / windowMs) : now.getTime();
	const rows: OutboxRow[] = [];
	for (const c of send) {
		const { block, from, to, due, place } = c;
		const treat = treats.get(block.id) ?? null;
		for (const r of due) {
			const msg = levelMessage({
				block: block.name,
				farm: place.farm,
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
				kind: kindOf(c),
				dedupeBase: `level:b${block.id}:${to.level}:w${bucket}`,
				now,
				timeZone: place.timeZone,
				urgent: to.level === 'severe',
				optedOut: stopped
			});
			if (row) rows.push(row);
		}
	}
	return writeRows(rows, t);
}

import { QueryTypes, type Transaction } from 'sequelize';
import type { Assessment as EngineAssessment, LevelKey } from '../engine';
import { queueLevelAlertsMany } from './alerts/levelAlerts';
import { queueRecommendationAlerts } from './alerts/recommendationAlerts';
import { AuditLog, type Block } from './db/models';
import { sqlTime } from './db/sql';

export interface LevelChange {
	block: Block;
	from: LevelKey | null;
	to: EngineAssessment;
	transaction?: Transaction;
}

/**
 * The single place a block's change of level goes. Runs inside the caller's transaction, so
 * whatever it writes (the audit entry, and the alert outbox rows) commits with the visit.
 * A rise queues one message per subscriber and channel (see alerts/levelAlerts.ts).
 */
export async function levelChanged(change: LevelChange) {
	await levelsChanged([change], change.transaction);
}

/** `levelChanged` for several changes (a batch of visits): one audit insert, one alert pass. */
export async function levelsChanged(changes: Omit<LevelChange, 'transaction'>[], t?: Transaction) {
	if (!changes.length) return;
	// One plain statement rather than the model's bulkCreate, which builds and validates an
	// instance per row: this runs inside every batch of visits that changes a level.
	const now = sqlTime(new Date());
	await AuditLog.sequelize!.query(
		`INSERT INTO audit_log (organisation_id, actor_id, action, entity, entity_id, details, created_at)
		 VALUES ${changes.map(() => "(?, NULL, 'level-changed', 'block', ?, ?, ?)").join(', ')}`,
		{
			replacements: changes.flatMap((c) => [
				c.block.organisationId,
				String(c.block.id),
				JSON.stringify({ from: c.from, to: c.to.level, reason: c.to.reason }),
				now
			]),
			type: QueryTypes.INSERT,
			transaction: t
		}
	);
	await queueLevelAlertsMany(changes, t);
}

export interface RecommendationEvent {
	recommendationId: number;
	blockId: number;
	organisationId: number;
	actorId: number;
	transaction?: Transaction;
}

/**
 * The single place an issued recommendation goes (to the grower's alerts). Runs inside the
 * caller's transaction.
 */
export async function recommendationIssued(e: RecommendationEvent) {
	await AuditLog.create(
		{
			organisationId: e.organisationId,
			actorId: e.actorId,
			action: 'recommendation-issued',
			entity: 'recommendation',
			entityId: String(e.recommendationId),
			details: { blockId: e.blockId }
		},
		{ transaction: e.transaction }
	);
	await queueRecommendationAlerts(e.recommendationId, e.transaction);
}

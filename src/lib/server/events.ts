import type { Transaction } from 'sequelize';
import type { Assessment as EngineAssessment, LevelKey } from '../engine';
import { queueLevelAlerts } from './alerts/levelAlerts';
import { queueRecommendationAlerts } from './alerts/recommendationAlerts';
import { AuditLog, type Block } from './db/models';

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
	await AuditLog.create(
		{
			organisationId: change.block.organisationId,
			actorId: null,
			action: 'level-changed',
			entity: 'block',
			entityId: String(change.block.id),
			details: { from: change.from, to: change.to.level, reason: change.to.reason }
		},
		{ transaction: change.transaction }
	);
	await queueLevelAlerts(change.block, change.from, change.to, change.transaction);
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

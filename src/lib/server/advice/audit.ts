import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { AuditLog } from '../db/models';

export interface AuditEntry {
	organisationId: number;
	actorId: number | null;
	action: string;
	entity: string;
	entityId: number | string;
	details?: Record<string, unknown>;
}

/** One audit row, written inside the caller's transaction so it commits with the change. */
export function audit(e: AuditEntry, transaction: Transaction) {
	return AuditLog.create(
		{
			organisationId: e.organisationId,
			actorId: e.actorId,
			action: e.action,
			entity: e.entity,
			entityId: String(e.entityId),
			details: e.details ?? null
		},
		{ transaction }
	);
}

export interface AuditRow {
	id: number;
	createdAt: string;
	actor: string | null;
	action: string;
	entity: string;
	entityId: string | null;
	details: string | null;
}

export const AUDIT_ENTITIES = ['recommendation', 'product', 'threshold-rule', 'block'] as const;

/** The organisation's audit trail, newest first, optionally for one kind of record. */
export function auditTrail(organisationId: number, entity: string | null, limit = 200) {
	return db().query<AuditRow>(
		`SELECT a.id, a.created_at AS createdAt, u.name AS actor, a.action, a.entity,
		        a.entity_id AS entityId, a.details
		   FROM audit_log a LEFT JOIN users u ON u.id = a.actor_id
		  WHERE a.organisation_id = ? ${entity ? 'AND a.entity = ?' : ''}
		  ORDER BY a.created_at DESC, a.id DESC LIMIT ${Math.max(1, Math.min(1000, limit))}`,
		{
			replacements: entity ? [organisationId, entity] : [organisationId],
			type: QueryTypes.SELECT
		}
	);
}

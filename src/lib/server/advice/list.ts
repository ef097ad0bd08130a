import { QueryTypes } from 'sequelize';
import type { Decision, RecommendationStatus, RecommendationWarning } from '$lib/domain';
import { db } from '../db';

/** A recommendation as screens and reports show it (plain, with product and people). */
export interface RecommendationRow {
	id: number;
	blockId: number;
	blockName: string;
	farmName: string;
	decision: Decision;
	status: RecommendationStatus;
	targetDate: string | null;
	rescoutBy: string | null;
	notes: string | null;
	warnings: RecommendationWarning[];
	issuedAt: string | null;
	acknowledgedAt: string | null;
	acknowledgedByName: string | null;
	appliedOn: string | null;
	appliedBy: string | null;
	followUpDue: string | null;
	createdAt: string;
	authorName: string;
	productName: string | null;
	activeIngredient: string | null;
	iracGroup: string | null;
	rate: number | null;
	rateUnit: string | null;
	reiHours: number | null;
	phiDays: number | null;
	beeHazard: string | null;
}

const SELECT = `
SELECT r.id, r.block_id AS blockId, b.name AS blockName, f.name AS farmName, r.decision, r.status,
       r.target_date AS targetDate, r.rescout_by AS rescoutBy, r.notes, r.warnings,
       r.issued_at AS issuedAt, r.acknowledged_at AS acknowledgedAt, k.name AS acknowledgedByName,
       r.applied_on AS appliedOn, r.applied_by AS appliedBy, r.follow_up_due AS followUpDue,
       r.created_at AS createdAt, a.name AS authorName, p.name AS productName,
       p.active_ingredient AS activeIngredient, p.irac_group AS iracGroup, p.rate,
       p.rate_unit AS rateUnit, p.rei_hours AS reiHours, p.phi_days AS phiDays,
       p.bee_hazard AS beeHazard
  FROM recommendations r
  JOIN blocks b ON b.id = r.block_id
  JOIN farms f ON f.id = b.farm_id
  JOIN users a ON a.id = r.author_id
  LEFT JOIN products p ON p.id = r.product_id
  LEFT JOIN users k ON k.id = r.acknowledged_by`;

const iso = (v: unknown) =>
	v instanceof Date ? v.toISOString() : v === null || v === undefined ? null : String(v);

function plain(r: RecommendationRow): RecommendationRow {
	const w = r.warnings as unknown;
	return {
		...r,
		warnings: typeof w === 'string' ? JSON.parse(w) : ((w as RecommendationWarning[]) ?? []),
		issuedAt: iso(r.issuedAt),
		acknowledgedAt: iso(r.acknowledgedAt),
		createdAt: iso(r.createdAt) ?? ''
	};
}

async function rows(where: string, replacements: unknown[]) {
	const out = await db().query<RecommendationRow>(
		`${SELECT} WHERE ${where} ORDER BY COALESCE(r.issued_at, r.created_at) DESC, r.id DESC`,
		{ replacements, type: QueryTypes.SELECT }
	);
	return out.map(plain);
}

/** Every recommendation of one block (the caller has checked the user may see the block). */
export const recommendationsOfBlock = (blockId: number) => rows('r.block_id = ?', [blockId]);

/** A grower's recommendations on own farms; drafts are the agronomist's and stay hidden. */
export const recommendationsOfGrower = (user: SessionUser) =>
	rows(`f.grower_id = ? AND r.organisation_id = ? AND r.status <> 'draft'`, [
		user.id,
		user.organisationId
	]);

/** The organisation's recommendations, optionally in one status. */
export const recommendationsOfOrganisation = (organisationId: number, status?: string | null) =>
	status
		? rows('r.organisation_id = ? AND r.status = ?', [organisationId, status])
		: rows('r.organisation_id = ?', [organisationId]);

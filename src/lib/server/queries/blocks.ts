import { QueryTypes } from 'sequelize';
import type { LevelKey } from '$lib/engine';
import { db } from '../db';
import { FOLLOW_UP_DUE_SQL } from '../scouting/due';

export interface BlockRow {
	id: number;
	name: string;
	farmId: number;
	farmName: string;
	growerName: string;
	crop: string;
	pest: string;
	areaHa: number;
	level: LevelKey | null;
	reason: string | null;
	lastVisitOn: string | null;
	rescoutDays: number;
}

const SELECT = `
SELECT b.id, b.name, b.farm_id AS farmId, f.name AS farmName, g.name AS growerName,
       c.name AS crop, p.name AS pest, b.area_ha AS areaHa, b.current_level AS level,
       b.current_reason AS reason, b.last_visit_on AS lastVisitOn, b.rescout_days AS rescoutDays
  FROM blocks b
  JOIN farms f ON f.id = b.farm_id
  JOIN users g ON g.id = f.grower_id
  JOIN crops c ON c.id = b.crop_id
  JOIN pests p ON p.id = b.pest_id`;

const ORDER = `ORDER BY FIELD(b.current_level, 'severe', 'action', 'stirring', 'calm') , b.last_visit_on ASC, b.name`;

/** Every block of an organisation, most pressing level first (one query). */
export function blocksOfOrganisation(organisationId: number) {
	return db().query<BlockRow>(`${SELECT} WHERE b.organisation_id = ? ${ORDER}`, {
		replacements: [organisationId],
		type: QueryTypes.SELECT
	});
}

/** The blocks on farms a grower owns, within their organisation. */
export function blocksOfGrower(growerId: number, organisationId: number) {
	return db().query<BlockRow>(
		`${SELECT} WHERE f.grower_id = ? AND b.organisation_id = ? ${ORDER}`,
		{ replacements: [growerId, organisationId], type: QueryTypes.SELECT }
	);
}

/**
 * The blocks a scout is assigned to (active assignments only), with the scout's own interval
 * and the block's open follow-up date (the late-scouting rule in scouting/due.ts).
 */
export function blocksOfScout(scoutId: number, organisationId: number) {
	return db().query<BlockRow & { followUpDue: string | null }>(
		`${SELECT.replace(
			'b.rescout_days AS rescoutDays',
			`a.interval_days AS rescoutDays, ${FOLLOW_UP_DUE_SQL} AS followUpDue`
		)}
		  JOIN scouting_assignments a ON a.block_id = b.id AND a.active = 1
		 WHERE a.scout_id = ? AND b.organisation_id = ?
		 ORDER BY b.last_visit_on IS NOT NULL, DATE_ADD(b.last_visit_on, INTERVAL a.interval_days DAY), b.name`,
		{ replacements: [scoutId, organisationId], type: QueryTypes.SELECT }
	);
}

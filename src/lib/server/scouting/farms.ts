import { QueryTypes } from 'sequelize';
import { db } from '../db';

/** Farms the user works on: the organisation's, or for a scout those with an assigned block. */
export function farmsFor(user: SessionUser) {
	const scout =
		user.role === 'scout'
			? 'AND f.id IN (SELECT b.farm_id FROM blocks b JOIN scouting_assignments a ON a.block_id = b.id AND a.active = 1 WHERE a.scout_id = :uid)'
			: '';
	return db().query<{ id: number; name: string; lat: number; lon: number }>(
		`SELECT f.id, f.name, f.lat, f.lon FROM farms f WHERE f.organisation_id = :org ${scout} ORDER BY f.name`,
		{ replacements: { org: user.organisationId, uid: user.id }, type: QueryTypes.SELECT }
	);
}

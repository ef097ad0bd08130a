import { QueryTypes } from 'sequelize';
import { db } from '$lib/server/db';
import { requireRole } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

// Counts only: the regional view never sees a grower, farm or block name.
export const load: PageServerLoad = async (event) => {
	requireRole(event, 'regional');
	const rows = await db().query<{
		crop: string;
		level: string | null;
		blocks: number;
		farms: number;
	}>(
		`SELECT c.name AS crop, b.current_level AS level, COUNT(*) AS blocks, COUNT(DISTINCT b.farm_id) AS farms
		   FROM blocks b JOIN crops c ON c.id = b.crop_id
		  GROUP BY c.name, b.current_level HAVING COUNT(DISTINCT b.farm_id) >= 3
		  ORDER BY c.name`,
		{ type: QueryTypes.SELECT }
	);
	return { rows: rows.map((r) => ({ ...r, blocks: Number(r.blocks), farms: Number(r.farms) })) };
};

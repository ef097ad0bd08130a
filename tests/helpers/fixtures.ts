import { QueryTypes } from 'sequelize';
import { testDb } from './db';
import { ensureDemoPhoto } from './photos';

/** Ids of demo records by role-visible name, for filling {placeholders} in probe paths. */
export async function demoIds(): Promise<Record<string, string>> {
	// The demo seed has no photos; a test photo on North Forty stands in for one.
	const photo = await ensureDemoPhoto();
	const rows = await testDb().query<{ k: string; id: number }>(
		`SELECT 'block' AS k, b.id FROM blocks b WHERE b.name = 'North Forty'
		 UNION ALL SELECT 'farm', f.id FROM farms f WHERE f.name = 'Heronsbrook Farm'
		 UNION ALL SELECT 'coopBlock', b.id FROM blocks b WHERE b.name = 'Brask Soy West'
		 UNION ALL SELECT 'otherGrowerBlock', b.id FROM blocks b WHERE b.name = 'River Flat'
		 UNION ALL SELECT 'coopTrap', t.id FROM traps t JOIN farms f ON f.id = t.farm_id WHERE f.name = 'Brask Farm'
		 UNION ALL SELECT 'coopVisit', MAX(v.id) FROM visits v JOIN blocks b ON b.id = v.block_id WHERE b.name = 'Brask Soy West'
		 UNION ALL SELECT 'trap', t.id FROM traps t JOIN farms f ON f.id = t.farm_id WHERE f.name = 'Heronsbrook Farm'
		 UNION ALL SELECT 'visit', MAX(v.id) FROM visits v JOIN blocks b ON b.id = v.block_id WHERE b.name = 'North Forty'
		 UNION ALL SELECT 'recommendation', MAX(r.id) FROM recommendations r JOIN blocks b ON b.id = r.block_id WHERE b.name = 'North Forty'`,
		{ type: QueryTypes.SELECT }
	);
	return {
		...Object.fromEntries(rows.filter((r) => r.id != null).map((r) => [r.k, String(r.id)])),
		photo: String(photo)
	};
}

export function fill(path: string, ids: Record<string, string>) {
	return path.replace(/\{(\w+)\}/g, (_, k: string) => {
		if (!ids[k]) throw new Error(`No demo id for {${k}} in ${path}`);
		return ids[k];
	});
}

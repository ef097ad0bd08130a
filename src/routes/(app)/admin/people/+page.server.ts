import { QueryTypes } from 'sequelize';
import { db } from '$lib/server/db';
import { requireRole } from '$lib/server/guard';
import type { Role } from '$lib/roles';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'admin');
	const people = await db().query<{ id: number; name: string; email: string; role: Role }>(
		`SELECT u.id, u.name, u.email, m.role FROM memberships m JOIN users u ON u.id = m.user_id
		  WHERE m.organisation_id = ? ORDER BY FIELD(m.role, 'admin', 'agronomist', 'scout', 'grower', 'regional'), u.name`,
		{ replacements: [user.organisationId], type: QueryTypes.SELECT }
	);
	return { people };
};

import { requireRole } from '$lib/server/guard';
import { AUDIT_ENTITIES, auditTrail } from '$lib/server/advice/audit';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const e = event.url.searchParams.get('entity');
	const entity = e && (AUDIT_ENTITIES as readonly string[]).includes(e) ? e : null;
	const rows = await auditTrail(user.organisationId, entity);
	return {
		entity,
		entities: AUDIT_ENTITIES,
		rows: rows.map((r) => ({
			...r,
			createdAt:
				(r.createdAt as unknown) instanceof Date
					? (r.createdAt as unknown as Date).toISOString()
					: String(r.createdAt),
			details: typeof r.details === 'string' ? r.details : JSON.stringify(r.details ?? null)
		}))
	};
};

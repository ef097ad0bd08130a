import Papa from 'papaparse';
import { requireRole } from '$lib/server/guard';
import { readFilter, triage } from '$lib/server/advice/triage';
import type { RequestHandler } from './$types';

/** The desk's triage table as CSV, with the same filters and order as the page. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const today = new Date().toISOString().slice(0, 10);
	const { rows } = await triage(user.organisationId, readFilter(event.url), today);
	const csv = Papa.unparse(
		rows.map((r) => ({
			urgency: r.urgency,
			block: r.name,
			farm: r.farmName,
			grower: r.growerName,
			crop: r.crop,
			pest: r.pest,
			level: r.level ?? '',
			reason: r.reason ?? '',
			days_to_action_threshold: r.daysToAction ?? '',
			action_threshold_date: r.actionDate ?? '',
			last_visit: r.lastVisitOn ?? '',
			days_since_visit: r.ageDays ?? '',
			days_overdue: r.overdueDays,
			scouts: r.scouts ?? '',
			open_recommendations: r.openRecs
		})),
		// Guards spreadsheets against formulas hidden in names (common practice).
		{ escapeFormulae: true }
	);
	return new Response(csv, {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="cornicle-triage-${today}.csv"`
		}
	});
};

import { json } from '@sveltejs/kit';
import { recommendationApiSchema } from '$lib/schemas/advice';
import { RECOMMENDATION_STATUSES } from '$lib/domain';
import { requireRole } from '$lib/server/guard';
import { readJson } from '$lib/server/advice/json';
import { blockFor } from '$lib/server/advice/scope';
import {
	recommendationsOfBlock,
	recommendationsOfGrower,
	recommendationsOfOrganisation
} from '$lib/server/advice/list';
import { saveRecommendation } from '$lib/server/advice/recommendations';
import type { RequestHandler } from './$types';

/** Recommendations the caller may see: `?block=` for one block, `?status=` for one state. */
export const GET: RequestHandler = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin', 'grower');
	const blockParam = event.url.searchParams.get('block');
	const status = event.url.searchParams.get('status');
	const okStatus = status && (RECOMMENDATION_STATUSES as readonly string[]).includes(status);
	let rows;
	if (blockParam) {
		const block = await blockFor(user, blockParam);
		rows = await recommendationsOfBlock(block.id);
		if (user.role === 'grower') rows = rows.filter((r) => r.status !== 'draft');
	} else if (user.role === 'grower') {
		rows = await recommendationsOfGrower(user);
	} else {
		rows = await recommendationsOfOrganisation(user.organisationId, okStatus ? status : null);
	}
	if (okStatus) rows = rows.filter((r) => r.status === status);
	return json({ recommendations: rows });
};

/** Creates a recommendation (a draft, or issued with `issue: true`); staff only. */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const body = await readJson(event.request, recommendationApiSchema);
	if (!body.ok) return body.response;
	const d = body.data;
	const res = await saveRecommendation(user, d.blockId, d, {
		issue: d.issue,
		confirmWarnings: d.confirmWarnings
	});
	if (!res.ok)
		return json(
			{
				message: res.message,
				issues: [{ path: res.field, message: res.message }],
				warnings: res.warnings
			},
			{ status: 400 }
		);
	return json({ id: res.rec.id, status: res.rec.status, warnings: res.warnings }, { status: 201 });
};

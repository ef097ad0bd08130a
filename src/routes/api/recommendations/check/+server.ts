import { json } from '@sveltejs/kit';
import { checkApiSchema } from '$lib/schemas/advice';
import type { Decision } from '$lib/domain';
import { requireRole } from '$lib/server/guard';
import { readJson } from '$lib/server/advice/json';
import { blockFor } from '$lib/server/advice/scope';
import { previewWarnings } from '$lib/server/advice/recommendations';
import type { RequestHandler } from './$types';

/** The label checks a draft treat would raise, for the form to show as it is filled in. */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const body = await readJson(event.request, checkApiSchema);
	if (!body.ok) return body.response;
	const d = body.data;
	const block = await blockFor(user, d.blockId);
	const res = await previewWarnings(
		user,
		block,
		{ decision: d.decision as Decision, productId: d.productId, targetDate: d.targetDate },
		d.exceptId ?? null
	);
	return json({ warnings: res.warnings });
};

import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { recommendationSchema } from '$lib/schemas/advice';
import type { Decision } from '$lib/domain';
import { requireRole } from '$lib/server/guard';
import { blockFor, recommendationFor } from '$lib/server/advice/scope';
import { productsOf } from '$lib/server/advice/library';
import { saveRecommendation } from '$lib/server/advice/recommendations';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

const adapter = zod4(recommendationSchema);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const block = await blockFor(user, event.params.id);
	const draftId = Number(event.url.searchParams.get('draft') ?? 0);
	let form = await superValidate(adapter, { id: 'recommendation' });
	if (draftId) {
		const { rec } = await recommendationFor(user, draftId);
		if (rec.blockId !== block.id || rec.status !== 'draft') error(404, 'No such draft.');
		form = await superValidate(
			{
				decision: rec.decision,
				productId: rec.productId ?? 0,
				targetDate: rec.targetDate ?? '',
				rescoutBy: rec.rescoutBy ?? '',
				notes: rec.notes ?? '',
				confirmWarnings: false
			},
			adapter,
			{ id: 'recommendation', errors: false }
		);
	}
	const products = await productsOf(user.organisationId, true);
	return {
		form,
		draftId: draftId || null,
		block: {
			id: block.id,
			name: block.name,
			farm: block.farm.name,
			crop: block.crop.name,
			pest: block.pest.name,
			level: block.currentLevel,
			reason: block.currentReason,
			expectedHarvest: block.expectedHarvest
		},
		products: products.map((p) => ({
			id: p.id,
			name: p.name,
			activeIngredient: p.activeIngredient,
			iracGroup: p.iracGroup,
			rate: p.rate,
			rateUnit: p.rateUnit,
			reiHours: p.reiHours,
			phiDays: p.phiDays,
			beeHazard: p.beeHazard
		}))
	};
};

async function save(event: RequestEvent, issue: boolean) {
	const user = requireRole(event, 'agronomist', 'admin');
	const form = await superValidate(event.request, adapter, { id: 'recommendation' });
	if (!form.valid) return fail(400, { form, warnings: [] });
	const draftId = Number(event.url.searchParams.get('draft') ?? 0) || undefined;
	const d = form.data;
	const res = await saveRecommendation(
		user,
		event.params.id,
		{
			decision: d.decision as Decision,
			productId: d.productId || null,
			targetDate: d.targetDate || null,
			rescoutBy: d.rescoutBy || null,
			notes: d.notes || null
		},
		{ issue, confirmWarnings: d.confirmWarnings, draftId }
	);
	if (!res.ok) {
		const field = res.field as 'productId' | 'confirmWarnings' | 'decision';
		setError(form, field, res.message);
		return fail(400, { form, warnings: res.warnings });
	}
	redirect(303, `/blocks/${res.rec.blockId}?${issue ? 'issued' : 'drafted'}=${res.rec.id}`);
}

export const actions: Actions = {
	draft: (event) => save(event, false),
	issue: (event) => save(event, true)
};

import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { thresholdSchema } from '$lib/schemas/advice';
import { requireRole } from '$lib/server/guard';
import { saveThreshold, setThresholdActive, thresholdLibrary } from '$lib/server/advice/library';
import type { Actions, PageServerLoad } from './$types';

const adapter = zod4(thresholdSchema);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const lib = await thresholdLibrary(user.organisationId);
	const editId = Number(event.url.searchParams.get('edit') ?? 0);
	const copyId = Number(event.url.searchParams.get('copy') ?? 0);
	let form = await superValidate(adapter, { id: 'threshold' });
	const from = lib.rules.find((r) => r.id === (editId || copyId));
	if ((editId || copyId) && (!from || (editId && !from.own))) error(404, 'No such rule.');
	if (from) {
		form = await superValidate(
			{
				id: editId ? from.id : 0,
				cropId: from.cropId,
				pestId: from.pestId,
				sampleUnitId: from.sampleUnitId,
				bbchFrom: from.bbchFrom,
				bbchTo: from.bbchTo,
				metric: from.metric,
				tallyThreshold: from.tallyThreshold ?? undefined,
				action: from.action,
				injury: from.injury ?? undefined,
				requiresRising: from.requiresRising,
				alsoProportion: from.alsoProportion ?? undefined,
				label: from.label,
				source: from.source,
				provenance: from.provenance
			},
			adapter,
			{ id: 'threshold', errors: false }
		);
	}
	return { ...lib, form, editing: editId || null };
};

export const actions: Actions = {
	save: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const form = await superValidate(event.request, adapter, { id: 'threshold' });
		if (!form.valid) return fail(400, { form });
		const res = await saveThreshold(user, form.data);
		if (!res.ok) return setError(form, res.field as 'cropId', res.message);
		redirect(303, `/library/thresholds?saved=${res.id}`);
	},
	retire: async (event) => toggle(event, false),
	restore: async (event) => toggle(event, true)
};

async function toggle(event: Parameters<Actions[string]>[0], active: boolean) {
	const user = requireRole(event, 'agronomist', 'admin');
	const id = Number((await event.request.formData()).get('id'));
	if (!Number.isInteger(id) || id <= 0) return fail(400, { message: 'No rule was named.' });
	await setThresholdActive(user, id, active);
	return { done: active ? 'switched on' : 'switched off' };
}

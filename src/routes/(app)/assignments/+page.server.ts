import { error, fail } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { assignmentSchema } from '$lib/schemas/scouting';
import { requireRole } from '$lib/server/guard';
import { blocksOfOrganisation } from '$lib/server/queries/blocks';
import { assign, assignmentsOf, scoutsOf, unassign } from '$lib/server/scouting/assignments';
import type { Actions, PageServerLoad } from './$types';

const adapter = zod4(assignmentSchema);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const [assignments, scouts, blocks] = await Promise.all([
		assignmentsOf(user.organisationId),
		scoutsOf(user.organisationId),
		blocksOfOrganisation(user.organisationId)
	]);
	return {
		assignments,
		scouts,
		blocks: blocks.map((b) => ({ id: b.id, name: b.name, farmName: b.farmName })),
		form: await superValidate(adapter, { id: 'assign' })
	};
};

export const actions: Actions = {
	assign: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const form = await superValidate(event.request, adapter, { id: 'assign' });
		if (!form.valid) return fail(400, { form });
		const r = await assign(user, form.data);
		if (!r.ok) return setError(form, r.field, r.message);
		return { form, done: 'Assigned.' };
	},
	end: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const id = z.coerce
			.number()
			.int()
			.positive()
			.safeParse((await event.request.formData()).get('id'));
		if (!id.success || !(await unassign(user, id.data))) error(404, 'No such assignment.');
		return { done: 'Assignment ended.' };
	}
};

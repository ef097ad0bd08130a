import { fail } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { trapSchema } from '$lib/schemas/scouting';
import { requireRole } from '$lib/server/guard';
import { db, Trap } from '$lib/server/db';
import { farmsFor } from '$lib/server/scouting/farms';
import { trapsFor } from '$lib/server/scouting/traps';
import type { Actions, PageServerLoad } from './$types';

const adapter = zod4(trapSchema);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin', 'scout');
	const [traps, farms] = await Promise.all([trapsFor(user), farmsFor(user)]);
	return {
		traps: traps.map((t) => ({
			...t,
			lastReadOn: t.lastReadOn ? String(t.lastReadOn).slice(0, 10) : null
		})),
		farms,
		canAdd: user.role !== 'scout',
		form: await superValidate(adapter, { id: 'trap' })
	};
};

export const actions: Actions = {
	add: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const form = await superValidate(event.request, adapter, { id: 'trap' });
		if (!form.valid) return fail(400, { form });
		const farm = (await farmsFor(user)).find((f) => f.id === form.data.farmId);
		if (!farm) return setError(form, 'farmId', 'No such farm');
		await db().transaction((transaction) =>
			Trap.create(
				{
					...form.data,
					organisationId: user.organisationId,
					installedOn: new Date().toISOString().slice(0, 10)
				},
				{ transaction }
			)
		);
		return { form, done: `Trap ${form.data.name} added.` };
	}
};

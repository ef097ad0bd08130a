import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { productSchema } from '$lib/schemas/advice';
import { requireRole } from '$lib/server/guard';
import { productsOf, saveProduct, setProductActive } from '$lib/server/advice/library';
import type { Actions, PageServerLoad } from './$types';

const adapter = zod4(productSchema);

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'agronomist', 'admin');
	const products = await productsOf(user.organisationId);
	const editId = Number(event.url.searchParams.get('edit') ?? 0);
	let form = await superValidate(adapter, { id: 'product' });
	if (editId) {
		const p = products.find((x) => x.id === editId);
		if (!p) error(404, 'No such product.');
		form = await superValidate({ ...p, notes: p.notes ?? '' }, adapter, {
			id: 'product',
			errors: false
		});
	}
	return {
		form,
		editing: editId || null,
		products: products.map((p) => ({ ...p, createdAt: undefined, updatedAt: undefined }))
	};
};

export const actions: Actions = {
	save: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const form = await superValidate(event.request, adapter, { id: 'product' });
		if (!form.valid) return fail(400, { form });
		const res = await saveProduct(user, form.data);
		if (!res.ok) return setError(form, res.field as 'name', res.message);
		redirect(303, `/library/products?saved=${res.id}`);
	},
	retire: async (event) => toggle(event, false),
	restore: async (event) => toggle(event, true)
};

async function toggle(event: Parameters<Actions[string]>[0], active: boolean) {
	const user = requireRole(event, 'agronomist', 'admin');
	const id = Number((await event.request.formData()).get('id'));
	if (!Number.isInteger(id) || id <= 0) return fail(400, { message: 'No product was named.' });
	await setProductActive(user, id, active);
	return { done: active ? 'restored' : 'retired' };
}

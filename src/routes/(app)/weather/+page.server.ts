import { fail } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { DD_BASE, singleDegreeDaysSine } from './dd';
import { weatherDaySchema } from '$lib/schemas/scouting';
import { requireRole } from '$lib/server/guard';
import { farmsFor } from '$lib/server/scouting/farms';
import { importWeather, recentDays, upsertDay } from '$lib/server/scouting/weather';
import type { Actions, PageServerLoad } from './$types';

const adapter = zod4(weatherDaySchema);
const ROLES = ['agronomist', 'admin', 'scout'] as const;

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, ...ROLES);
	const farms = await farmsFor(user);
	const wanted = Number(event.url.searchParams.get('farm'));
	const farm = farms.find((f) => f.id === wanted) ?? farms[0] ?? null;
	const days = farm ? await recentDays(farm.id) : [];
	const form = await superValidate(adapter, { id: 'day' });
	if (farm) form.data.farmId = farm.id;
	form.data.day = new Date().toISOString().slice(0, 10);
	return { farms, farm, days: singleDegreeDaysSine(days), base: DD_BASE, form };
};

async function farmOf(event: Parameters<Actions[string]>[0], farmId: number) {
	const user = requireRole(event, ...ROLES);
	return (await farmsFor(user)).find((f) => f.id === farmId) ?? null;
}

export const actions: Actions = {
	day: async (event) => {
		const form = await superValidate(event.request, adapter, { id: 'day' });
		if (!form.valid) return fail(400, { form });
		if (!(await farmOf(event, form.data.farmId))) return setError(form, 'farmId', 'No such farm');
		await upsertDay(form.data.farmId, form.data.day, form.data.tminC, form.data.tmaxC);
		return { form, done: `Stored ${form.data.day}.` };
	},
	csv: async (event) => {
		const data = await event.request.formData();
		const farmId = Number(data.get('farmId'));
		const file = data.get('file');
		if (!(await farmOf(event, farmId)))
			return fail(400, {
				csv: {
					issues: [{ row: 0, column: 'farmId', message: 'Choose a farm' }],
					stored: 0,
					days: 0
				}
			});
		if (!(file instanceof File) || file.size === 0)
			return fail(400, {
				csv: {
					issues: [{ row: 0, column: 'file', message: 'Choose a CSV file' }],
					stored: 0,
					days: 0
				}
			});
		const r = await importWeather(farmId, await file.text(), data.get('commit') === '1');
		const csv = { issues: r.issues.slice(0, 50), stored: r.stored, days: r.days.length };
		return r.issues.length ? fail(400, { csv }) : { csv };
	}
};

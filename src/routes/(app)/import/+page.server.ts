import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guard';
import { CSV_COLUMNS, commitImport, planImport } from '$lib/server/scouting/csv';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	requireRole(event, 'agronomist', 'admin');
	return { columns: [...CSV_COLUMNS] };
};

async function fileText(request: Request) {
	const data = await request.formData();
	const file = data.get('file');
	return file instanceof File && file.size > 0 ? await file.text() : null;
}

const noFile = {
	issues: [{ row: 0, column: 'file', message: 'Choose a CSV file' }],
	visits: [],
	rows: 0
};

export const actions: Actions = {
	preview: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const text = await fileText(event.request);
		if (text === null) return fail(400, { preview: noFile, stored: 0 });
		const { groups: _g, ...plan } = await planImport(text, user.organisationId);
		const preview = {
			...plan,
			issues: plan.issues.slice(0, 100),
			visits: plan.visits.slice(0, 200)
		};
		return plan.issues.length ? fail(400, { preview, stored: 0 }) : { preview, stored: 0 };
	},
	commit: async (event) => {
		const user = requireRole(event, 'agronomist', 'admin');
		const text = await fileText(event.request);
		if (text === null) return fail(400, { preview: noFile, stored: 0 });
		const r = await commitImport(text, user);
		const { groups: _g, ...plan } = r.plan;
		const preview = {
			...plan,
			issues: plan.issues.slice(0, 100),
			visits: plan.visits.slice(0, 200)
		};
		if (!r.ok) return fail(400, { preview, stored: 0 });
		return { preview, stored: r.visitIds.length };
	}
};

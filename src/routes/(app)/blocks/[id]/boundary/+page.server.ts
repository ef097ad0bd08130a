import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { checkBoundary } from '$lib/geo/validate';
import { blockForBoundary, checkBoundaryUpload, saveBoundary } from '$lib/server/boundaries';
import { requireRole } from '$lib/server/guard';
import type { Actions, PageServerLoad } from './$types';

const idParam = z.coerce.number().int().positive();

/** The form: a GeoJSON text (drawn, imported in the browser, or pasted) or an uploaded file. */
const schema = z.object({
	boundary: z.string().max(2_000_000, 'The boundary text is over 2 MB.').optional(),
	file: z.instanceof(File).optional()
});

async function block(raw: string, organisationId: number) {
	const id = idParam.safeParse(raw);
	const b = id.success ? await blockForBoundary(id.data, organisationId) : null;
	if (!b) error(404, 'No such block.');
	return b;
}

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'admin', 'agronomist');
	const b = await block(event.params.id, user.organisationId);
	return {
		block: {
			id: b.id,
			name: b.name,
			areaHa: b.areaHa,
			level: b.currentLevel ?? null,
			boundary: b.boundary ?? null,
			centre: [b.centroidLat, b.centroidLon] as [number, number]
		}
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireRole(event, 'admin', 'agronomist');
		const b = await block(event.params.id, user.organisationId);
		const fd = await event.request.formData();
		const file = fd.get('file');
		const parsed = schema.safeParse({
			boundary: String(fd.get('boundary') ?? '').trim() || undefined,
			file: file instanceof File && file.size > 0 ? file : undefined
		});
		if (!parsed.success)
			return fail(400, { field: 'boundary', message: parsed.error.issues[0].message, text: '' });
		const { boundary: text, file: upload } = parsed.data;
		let checked;
		if (text) {
			let geojson: unknown;
			try {
				geojson = JSON.parse(text);
			} catch (e) {
				return fail(400, {
					field: 'boundary',
					message: `The boundary is not valid GeoJSON text (${(e as Error).message}).`,
					text
				});
			}
			checked = checkBoundary(geojson);
		} else if (upload) {
			checked = await checkBoundaryUpload(upload);
		} else {
			return fail(400, {
				field: 'boundary',
				message: 'Draw the boundary on the map, or choose a GeoJSON or KML file.',
				text: ''
			});
		}
		if (!checked.ok)
			return fail(400, {
				field: text ? 'boundary' : 'file',
				message: checked.message,
				text: text ?? ''
			});
		await saveBoundary(b.id, user.organisationId, user.id, checked);
		redirect(303, `/map?focus=${b.id}`);
	}
};

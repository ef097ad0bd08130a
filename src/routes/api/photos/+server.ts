import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole } from '$lib/server/guard';
import { badRequest, invalid } from '$lib/server/scouting/http';
import { PHOTO_MAX_BYTES, savePhoto } from '$lib/server/scouting/photos';
import type { RequestHandler } from './$types';

const fields = z
	.object({
		blockId: z.coerce.number().int().positive().optional(),
		trapId: z.coerce.number().int().positive().optional(),
		caption: z.string().max(300).optional()
	})
	.refine((f) => !!f.blockId !== !!f.trapId, {
		path: ['blockId'],
		message: 'give blockId or trapId'
	});

/** Uploads one photo (multipart/form-data: file, blockId or trapId, caption). */
export const POST: RequestHandler = async (event) => {
	const user = requireRole(event, 'scout', 'agronomist', 'admin');
	const length = Number(event.request.headers.get('content-length') ?? 0);
	if (length > PHOTO_MAX_BYTES + 64 * 1024)
		return json(
			{
				message: `file: the photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB`,
				issues: [{ path: 'file', message: 'too large' }]
			},
			{ status: 413 }
		);
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		return badRequest('Send the photo as multipart/form-data with a "file" field.', 'file');
	}
	const file = form.get('file');
	if (!(file instanceof File)) return badRequest('file: choose a photo to upload', 'file');
	const parsed = fields.safeParse({
		blockId: form.get('blockId') || undefined,
		trapId: form.get('trapId') || undefined,
		caption: form.get('caption') || undefined
	});
	if (!parsed.success) return invalid(parsed.error, 'photo');
	const r = await savePhoto(
		user,
		parsed.data,
		Buffer.from(await file.arrayBuffer()),
		parsed.data.caption ?? null
	);
	if (!r.ok)
		return json(
			{ message: r.message, issues: [{ path: r.path ?? '', message: r.message }] },
			{ status: r.status }
		);
	return json({ created: r.created, photo: r.photo }, { status: r.created ? 201 : 200 });
};

import { json } from '@sveltejs/kit';
import type { z } from 'zod';

/** Reads a JSON body against a schema; a 400 answer names each bad field. */
export async function readJson<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<{ ok: true; data: z.infer<S> } | { ok: false; response: Response }> {
	let body: unknown;
	try {
		body = await request.json();
	} catch {
		return {
			ok: false,
			response: json({ message: 'The body must be JSON.', issues: [] }, { status: 400 })
		};
	}
	const p = schema.safeParse(body);
	if (p.success) return { ok: true, data: p.data };
	return {
		ok: false,
		response: json(
			{
				message: 'Some fields are not right.',
				issues: p.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
			},
			{ status: 400 }
		)
	};
}

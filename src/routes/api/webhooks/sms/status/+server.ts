import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { db } from '$lib/server/db';
import { currentSettings } from '$lib/server/alerts/settings';
import { applyStatus, statusCallbackSchema } from '$lib/server/alerts/status';
import { readSignedForm } from '$lib/server/alerts/verify';
import type { RequestHandler } from './$types';

const query = z.object({
	n: z.coerce.number().int().positive('n: the outbox row id'),
	a: z.coerce.number().int().positive('a: the attempt number')
});

// Public (no session): the SMS provider calls it. The signature is the guard: unsigned or
// forged requests get 403 before anything is read from the database.
export const POST: RequestHandler = async ({ request, url }) => {
	const s = currentSettings();
	const { params, valid } = await readSignedForm(request, url, s);
	if (!valid) error(403, 'Signature missing or wrong.');
	const q = query.safeParse(Object.fromEntries(url.searchParams));
	const body = statusCallbackSchema.safeParse(params);
	if (!q.success || !body.success) {
		const issues = [...(q.error?.issues ?? []), ...(body.error?.issues ?? [])];
		return json(
			{
				message: 'Bad status callback.',
				issues: issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
			},
			{ status: 400 }
		);
	}
	const changed = await applyStatus(db(), s, q.data.n, q.data.a, body.data);
	return json({ changed });
};

import { json } from '@sveltejs/kit';
import type { z } from 'zod';
import { issuesOf } from '$lib/schemas/scouting';
import type { Refusal } from './access';

/** A 400 that names each field: `{ message, issues: [{ path, message }] }`. */
export function invalid(error: z.ZodError, what = 'request') {
	const issues = issuesOf(error);
	const first = issues[0];
	return json(
		{
			message: `The ${what} has ${issues.length === 1 ? 'an error' : `${issues.length} errors`}: ${first.path || 'body'}: ${first.message}`,
			issues
		},
		{ status: 400 }
	);
}

export function refuse(r: Refusal) {
	return json({ message: r.message }, { status: r.status });
}

export function badRequest(message: string, path = '') {
	return json({ message, issues: [{ path, message }] }, { status: 400 });
}

/** The JSON body, or null when it is not JSON. */
export async function readJson(request: Request): Promise<unknown | null> {
	try {
		return await request.json();
	} catch {
		return null;
	}
}

import { json } from '@sveltejs/kit';
import { db } from '$lib/server/db';

/** Liveness and database reachability, for load balancers and the start script. */
export async function GET() {
	try {
		await db().query('SELECT 1');
		return json({ ok: true, database: 'up' });
	} catch {
		return json({ ok: false, database: 'down' }, { status: 503 });
	}
}

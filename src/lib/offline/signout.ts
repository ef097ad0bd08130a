import { offlineDb } from './db';
import { PAGE_CACHE } from './warm';

/**
 * What a shared phone must forget when someone signs out: the saved pages (they hold the
 * scout's blocks and farms) and the outbox. Records not yet sent are only deleted when the
 * person agrees (`confirm` gets their number); sending them later under someone else's
 * sign-in would file them in the wrong name. Returns false when the person chose to stay.
 */
export async function forgetOnSignOut(confirm: (unsent: number) => boolean): Promise<boolean> {
	try {
		const db = await offlineDb();
		const items = await db.getAll('outbox');
		const unsent = items.filter((i) => i.status !== 'sent').length;
		if (unsent > 0 && !confirm(unsent)) return false;
		await db.clear('outbox');
		if ('caches' in window) await caches.delete(PAGE_CACHE);
	} catch {
		// No IndexedDB or Cache Storage here (private mode, old browser): nothing was saved.
	}
	return true;
}

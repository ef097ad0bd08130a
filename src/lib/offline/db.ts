import { openDB, type DBSchema, type IDBPDatabase } from 'idb';

export type OutboxKind = 'visit' | 'trap-reading';
export type OutboxStatus = 'waiting' | 'sending' | 'sent' | 'failed';

export interface QueuedPhoto {
	blob: Blob;
	name: string;
	/** The server's id once uploaded, so a retry does not upload it again. */
	id?: number;
}

export interface OutboxItem {
	/** The clientKey sent with the request: made on the phone, unique per record. */
	key: string;
	kind: OutboxKind;
	/** What the scout sees in the list ("North Forty, 12 Aug"). */
	label: string;
	url: string;
	body: Record<string, unknown>;
	photos: QueuedPhoto[];
	photoTarget: { blockId: number } | { trapId: number };
	status: OutboxStatus;
	error: string | null;
	attempts: number;
	createdAt: number;
	sentAt: number | null;
	/** What the server answered (the stored record, and for visits the assessment). */
	result: Record<string, unknown> | null;
}

interface OfflineDb extends DBSchema {
	outbox: { key: string; value: OutboxItem; indexes: { byCreated: number } };
}

let dbp: Promise<IDBPDatabase<OfflineDb>> | null = null;

/** The phone's own database: what waits to be sent survives a closed browser. */
export function offlineDb() {
	dbp ??= openDB<OfflineDb>('cornicle-offline', 1, {
		upgrade(db) {
			const s = db.createObjectStore('outbox', { keyPath: 'key' });
			s.createIndex('byCreated', 'createdAt');
		}
	});
	return dbp;
}

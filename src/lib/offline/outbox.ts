import { offlineDb, type OutboxItem, type QueuedPhoto } from './db';

export type { OutboxItem } from './db';

const CHANGED = 'cornicle-outbox-changed';
const channel = typeof BroadcastChannel !== 'undefined' ? new BroadcastChannel(CHANGED) : null;

function changed() {
	window.dispatchEvent(new Event(CHANGED));
	channel?.postMessage('changed');
}

/** Calls `fn` whenever the outbox changes in this tab or another. Returns the unsubscribe. */
export function onOutboxChange(fn: () => void) {
	window.addEventListener(CHANGED, fn);
	channel?.addEventListener('message', fn);
	return () => {
		window.removeEventListener(CHANGED, fn);
		channel?.removeEventListener('message', fn);
	};
}

/** A key for a new record, made on the phone (the server stores it once, however often sent). */
export function newClientKey() {
	return crypto.randomUUID().replaceAll('-', '');
}

export async function enqueue(
	item: Pick<OutboxItem, 'key' | 'kind' | 'label' | 'url' | 'body' | 'photoTarget'> & {
		photos?: QueuedPhoto[];
	}
) {
	const db = await offlineDb();
	await db.put('outbox', {
		photos: [],
		...item,
		status: 'waiting',
		error: null,
		attempts: 0,
		createdAt: Date.now(),
		sentAt: null,
		result: null
	});
	changed();
}

export async function outboxItems(): Promise<OutboxItem[]> {
	const db = await offlineDb();
	return (await db.getAllFromIndex('outbox', 'byCreated')).reverse();
}

export async function outboxItem(key: string) {
	return (await offlineDb()).get('outbox', key);
}

async function save(item: OutboxItem) {
	await (await offlineDb()).put('outbox', item);
	changed();
}

/** Puts a failed item back in the queue (after the scout fixed what the server refused). */
export async function retry(key: string) {
	const item = await outboxItem(key);
	if (!item || item.status === 'sent') return;
	await save({ ...item, status: 'waiting', error: null });
	void flush();
}

export async function discard(key: string) {
	await (await offlineDb()).delete('outbox', key);
	changed();
}

/** Why the server refused, in its own words (first field-level issue included). */
async function reason(res: Response) {
	try {
		const body = (await res.json()) as { message?: string };
		return body.message ?? `refused (${res.status})`;
	} catch {
		return `refused (${res.status})`;
	}
}

type Outcome =
	{ done: true; result: Record<string, unknown> } | { done: false; error: string; final: boolean };

async function post(url: string, init: RequestInit): Promise<Response | null> {
	try {
		return await fetch(url, { ...init, credentials: 'same-origin' });
	} catch {
		return null;
	}
}

function failure(res: Response | null, message: string | null): Outcome {
	if (!res)
		return { done: false, error: 'No connection; will send when back online.', final: false };
	if (res.status === 401)
		return { done: false, error: 'Signed out: sign in again to send.', final: false };
	if (res.status >= 500 || res.status === 408 || res.status === 429)
		return { done: false, error: `Server busy (${res.status}); will retry.`, final: false };
	return { done: false, error: message ?? `Refused (${res.status})`, final: true };
}

async function sendOne(item: OutboxItem): Promise<Outcome> {
	for (const p of item.photos) {
		if (p.id) continue;
		const form = new FormData();
		form.set('file', p.blob, p.name);
		for (const [k, v] of Object.entries(item.photoTarget)) form.set(k, String(v));
		const res = await post('/api/photos', { method: 'POST', body: form });
		if (!res || !res.ok) return failure(res, res ? `Photo ${p.name}: ${await reason(res)}` : null);
		p.id = ((await res.json()) as { photo: { id: number } }).photo.id;
		await save(item);
	}
	const body = { ...item.body, photoIds: item.photos.map((p) => p.id) };
	const res = await post(item.url, {
		method: 'POST',
		headers: { 'content-type': 'application/json', 'x-cornicle-channel': 'phone' },
		body: JSON.stringify(body)
	});
	if (res && res.ok) return { done: true, result: (await res.json()) as Record<string, unknown> };
	return failure(res, res ? await reason(res) : null);
}

let running: Promise<void> | null = null;
let again = false;

/**
 * Sends everything waiting, oldest first; one run at a time per tab (and per phone, with locks).
 * Nothing while the phone is offline.
 */
export function flush(): Promise<void> {
	// A phone that knows it has no connection tries nothing: a request sent then can still
	// reach the server while its answer is lost, and the 'online' event sends everything
	// (startAutoFlush).
	if (navigator.onLine === false) return running ?? Promise.resolve();
	if (running) {
		again = true; // something was queued meanwhile: go round once more
		return running;
	}
	running = (async () => {
		try {
			do {
				again = false;
				if (navigator.locks) await navigator.locks.request('cornicle-outbox', flushAll);
				else await flushAll();
			} while (again);
		} finally {
			running = null;
		}
	})();
	return running;
}

async function flushAll() {
	const items = (await outboxItems())
		.reverse()
		.filter((i) => i.status === 'waiting' || i.status === 'sending');
	for (const item of items) {
		await save({ ...item, status: 'sending', attempts: item.attempts + 1 });
		const r = await sendOne(item);
		if (r.done)
			await save({
				...item,
				status: 'sent',
				error: null,
				sentAt: Date.now(),
				result: r.result,
				attempts: item.attempts + 1
			});
		else {
			await save({
				...item,
				status: r.final ? 'failed' : 'waiting',
				error: r.error,
				attempts: item.attempts + 1
			});
			if (!r.final) break; // offline or server down: the rest would fail the same way
		}
	}
}

/** Items left "sending" by a closed tab go back to "waiting" (only when no tab is sending). */
async function recover() {
	const run = async () => {
		for (const i of await outboxItems())
			if (i.status === 'sending') await save({ ...i, status: 'waiting' });
	};
	if (!navigator.locks) return run();
	await navigator.locks.request('cornicle-outbox', { ifAvailable: true }, (lock) =>
		lock ? run() : undefined
	);
}

/** Sends when the connection returns, when the page shows again, and every half minute. */
export function startAutoFlush() {
	void recover();
	const go = () => void flush();
	window.addEventListener('online', go);
	document.addEventListener('visibilitychange', go);
	const timer = setInterval(go, 30_000);
	go();
	return () => {
		window.removeEventListener('online', go);
		document.removeEventListener('visibilitychange', go);
		clearInterval(timer);
	};
}

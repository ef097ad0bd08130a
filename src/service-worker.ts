/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
// The scout's offline worker (scope /rounds): the app shell from a cache made at install, the
// scout's pages network-first with the last copy as fallback. Writes never go through a cache:
// the outbox in IndexedDB (src/lib/offline) holds them until the server has them.
import { build, files, version } from '$service-worker';

const sw = self as unknown as ServiceWorkerGlobalScope;
const SHELL = `cornicle-shell-${version}`;
const PAGES = 'cornicle-pages-v1';
const ASSETS = new Set([...build, ...files]);

sw.addEventListener('install', (event) => {
	event.waitUntil(
		caches
			.open(SHELL)
			.then((c) => c.addAll([...ASSETS]))
			.then(() => sw.skipWaiting())
	);
});

sw.addEventListener('activate', (event) => {
	event.waitUntil(
		(async () => {
			for (const key of await caches.keys())
				if (key.startsWith('cornicle-shell-') && key !== SHELL) await caches.delete(key);
			await sw.clients.claim();
		})()
	);
});

async function fromShell(request: Request) {
	return (await caches.match(request, { cacheName: SHELL })) ?? fetch(request);
}

async function networkFirst(request: Request) {
	const cache = await caches.open(PAGES);
	const key = new URL(request.url);
	// Kit asks for page data with a query naming the parts to reload; the full copy serves all.
	if (key.pathname.endsWith('/__data.json')) key.search = '';
	try {
		const res = await fetch(request);
		if (res.ok && !res.redirected) await cache.put(key.href, res.clone());
		return res;
	} catch {
		const hit = await cache.match(key.href);
		if (hit) return hit;
		return new Response(
			'<!doctype html><meta charset="utf-8"><title>Offline</title><p>You are offline and this page was not saved on the phone. Open My rounds while online first.</p>',
			{ status: 503, headers: { 'content-type': 'text/html; charset=utf-8' } }
		);
	}
}

sw.addEventListener('fetch', (event) => {
	const { request } = event;
	if (request.method !== 'GET') return;
	const url = new URL(request.url);
	if (url.origin !== sw.location.origin) return;
	if (ASSETS.has(url.pathname)) {
		event.respondWith(fromShell(request));
		return;
	}
	if (url.pathname === '/rounds' || url.pathname.startsWith('/rounds/')) {
		event.respondWith(networkFirst(request));
	}
});

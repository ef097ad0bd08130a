/** The cache the service worker answers pages from when there is no connection. */
export const PAGE_CACHE = 'cornicle-pages-v1';

/**
 * Registers the offline worker for the scout's screens and stores the pages the scout will need
 * out of signal (each assigned block's visit form, each trap's reading form).
 */
export async function prepareOffline(urls: string[]) {
	if (!('serviceWorker' in navigator) || !('caches' in window)) return false;
	await navigator.serviceWorker.register('/service-worker.js', {
		scope: '/rounds',
		type: 'classic'
	});
	const cache = await caches.open(PAGE_CACHE);
	const all = urls.flatMap((u) => [u, `${u.replace(/\/$/, '')}/__data.json`]);
	await Promise.all(
		all.map(async (u) => {
			try {
				const res = await fetch(u, { credentials: 'same-origin' });
				if (res.ok) await cache.put(u, res);
			} catch {
				// Offline already: keep what the cache has.
			}
		})
	);
	return true;
}

import { onMount } from 'svelte';

/**
 * Whether the phone says it has a connection (`navigator.onLine`), kept current from the
 * browser's online and offline events while the calling component is mounted.
 */
export function useOnline() {
	const net = $state({ online: true });
	onMount(() => {
		const update = () => (net.online = navigator.onLine);
		update();
		window.addEventListener('online', update);
		window.addEventListener('offline', update);
		return () => {
			window.removeEventListener('online', update);
			window.removeEventListener('offline', update);
		};
	});
	return net;
}

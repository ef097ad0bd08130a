// Form actions, read from the route modules themselves (Vite's import.meta.glob), so an action
// added anywhere shows up here without a list to keep by hand.
const modules = import.meta.glob<{ actions?: Record<string, unknown> }>(
	'/src/routes/**/+page.server.ts'
);

/** Every form action in the route tree as "route id ?/name" (`default` for a default action). */
export async function formActions(): Promise<string[]> {
	const out: string[] = [];
	for (const [file, load] of Object.entries(modules)) {
		const mod = await load();
		if (!mod.actions) continue;
		const id = file.replace(/^\/src\/routes/, '').replace(/\/\+page\.server\.ts$/, '') || '/';
		for (const name of Object.keys(mod.actions)) out.push(`${id} ?/${name}`);
	}
	return out.sort();
}

/** The URL that posts to an action. */
export function actionUrl(key: string, fill: (p: string) => string) {
	const [id, name] = key.split(' ?/');
	const path = fill(id.replace(/\/\([^)]+\)/g, '') || '/');
	return name === 'default' ? path : `${path}?/${name}`;
}

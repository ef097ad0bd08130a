import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const ROUTES = join(import.meta.dirname, '../../src/routes');

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		return statSync(p).isDirectory() ? walk(p) : [p];
	});
}

const routeId = (file: string) => {
	const dir = relative(ROUTES, file).split('/').slice(0, -1).join('/');
	return '/' + dir;
};

/** Every page route (a +page.svelte or +page.server.ts) by route id. */
export function pageRoutes(): string[] {
	const ids = walk(ROUTES)
		.filter((f) => /\+page(\.server)?\.(svelte|ts)$/.test(f))
		.map(routeId);
	return [...new Set(ids)].map((id) => (id === '/' ? '/' : id.replace(/\/$/, '')));
}

/** Every endpoint as "METHOD route id", read from the exported handlers of +server.ts files. */
export function endpointRoutes(): string[] {
	return walk(ROUTES)
		.filter((f) => f.endsWith('+server.ts'))
		.flatMap((f) => {
			const src = readFileSync(f, 'utf8');
			const methods = [
				...src.matchAll(
					/export\s+(?:const|async function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g
				)
			].map((m) => m[1]);
			return [...new Set(methods)].map((m) => `${m} ${routeId(f)}`);
		});
}

/** The URL for a route id: groups dropped. */
export function urlFor(id: string) {
	return id.replace(/\/\([^)]+\)/g, '') || '/';
}

// The scout page's first-load JavaScript, gzipped: every script the page's HTML loads or
// preloads, fetched from the running app and compressed as a server would send it.
import { gzipSync } from 'node:zlib';
import { signIn } from './stats';

const APP = process.env.BENCH_APP_URL!;
const TARGET_KB = 80;

const cookie = await signIn(APP, 'tomas@brackenridge.test');
const html = await (await fetch(`${APP}/rounds`, { headers: { cookie } })).text();
const urls = new Set<string>();
for (const tag of html.match(/<link\b[^>]*>/g) ?? []) {
	const href = tag.match(/\bhref="([^"]+)"/)?.[1];
	if (href && /\brel="modulepreload"/.test(tag)) urls.add(href);
}
for (const m of html.matchAll(/<script[^>]+src="([^"]+)"/g)) urls.add(m[1]);
for (const m of html.matchAll(/import\("([^"]+\.js)"\)/g)) urls.add(m[1]);
// What those entry modules import statically is loaded at once too: follow it.
const seen = new Set<string>();
const queue = [...urls].map((u) => new URL(u, `${APP}/rounds`).href);
while (queue.length) {
	const u = queue.pop()!;
	if (seen.has(u)) continue;
	seen.add(u);
	const src = await (await fetch(u)).text();
	for (const m of src.matchAll(
		/(?:^|[;\n}])\s*import\s*(?:[^'"()]*?from\s*)?["']([^"']+\.js)["']/g
	)) {
		queue.push(new URL(m[1], u).href);
	}
}
urls.clear();
for (const u of seen) urls.add(u);
let raw = 0;
let gz = 0;
for (const u of urls) {
	const body = Buffer.from(await (await fetch(new URL(u, `${APP}/rounds`))).arrayBuffer());
	raw += body.length;
	gz += gzipSync(body, { level: 9 }).length;
}
const kb = gz / 1024;
console.log(
	`Scout page (/rounds) first-load JavaScript: ${urls.size} files, ${(raw / 1024).toFixed(1)} KB raw, ${kb.toFixed(1)} KB gzipped (target < ${TARGET_KB} KB: ${kb < TARGET_KB ? 'met' : 'NOT met'})`
);

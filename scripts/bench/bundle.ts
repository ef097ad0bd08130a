// The scout page's first-load JavaScript, gzipped: every script the page's HTML loads or
// preloads, fetched from the running app and compressed as a server would send it.
import { gzipSync } from 'node:zlib';
import { signIn } from './stats';

const APP = process.env.BENCH_APP_URL!;
const TARGET_KB = 80;

const cookie = await signIn(APP, 'tomas@brackenridge.test');
const html = await (await fetch(`${APP}/rounds`, { headers: { cookie } })).text();
const urls = new Set<string>();
for (const m of html.matchAll(/<link[^>]+rel="modulepreload"[^>]+href="([^"]+)"/g)) urls.add(m[1]);
for (const m of html.matchAll(/<script[^>]+src="([^"]+)"/g)) urls.add(m[1]);
for (const m of html.matchAll(/import\("([^"]+\.js)"\)/g)) urls.add(m[1]);
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

import type { BBox } from '$lib/map/params';
import { blocksWithPrint, mapBlocks, mapPrint, type MapScope } from './queries/map';

type Query = { bbox?: BBox; crop?: string; pest?: string; on?: string };

/** Bodies kept per process, newest use last; bounded in bytes (a 5,000-block list is ~2 MB). */
const MAX_BYTES = 64 * 1024 * 1024;
const kept = new Map<string, { print: string; body: string }>();
let bytes = 0;

function keep(key: string, v: { print: string; body: string }) {
	const old = kept.get(key);
	if (old) bytes -= old.body.length;
	kept.delete(key);
	kept.set(key, v);
	bytes += v.body.length;
	for (const [k, e] of kept) {
		if (bytes <= MAX_BYTES || k === key) break;
		kept.delete(k);
		bytes -= e.body.length;
	}
}

/**
 * The map's current-level block list, answered from memory while the blocks' fingerprint is
 * unchanged (one light query), else built afresh with its fingerprint in one statement, so a
 * kept body always matches the rows it was read from. Lists as of a past day are not kept.
 */
export async function cachedMapBlocks(
	scope: MapScope,
	q: Query
): Promise<{ body: string; print: string | null }> {
	if (q.on) return { body: await mapBlocks(scope, q), print: null };
	const key = JSON.stringify([scope, q]);
	const hit = kept.get(key);
	if (hit) {
		const print = await mapPrint(scope, q);
		if (print === hit.print) {
			keep(key, hit);
			return hit;
		}
	}
	const fresh = await blocksWithPrint(scope, q);
	keep(key, fresh);
	return fresh;
}

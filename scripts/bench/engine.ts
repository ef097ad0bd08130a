// Bench for the pressure engine: 10,000 blocks x 20 visits x 30 stops on one core.
// Data are generated from a seeded PRNG so every run assesses the same blocks.
import { pathToFileURL } from 'node:url';
import {
	assessBlock,
	type AssessBlockInput,
	type VisitInput,
	type WeatherDay
} from '../../src/lib/engine/index';
import { CROPS, PESTS, THRESHOLDS } from '../../src/lib/engine/library';

function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

const iso = (day: number) =>
	new Date(Date.UTC(2025, 5, 1) + day * 86_400_000).toISOString().slice(0, 10);

function makeBlocks(
	rnd: () => number,
	count: number,
	visits: number,
	stops: number
): AssessBlockInput[] {
	const crop = CROPS.find((c) => c.code === 'soybean')!;
	const pest = PESTS.find((p) => p.code === 'soybean-aphid')!;
	const days = visits * 5;
	const weather: WeatherDay[] = Array.from({ length: days }, (_, d) => {
		const tmin = 12 + 6 * rnd();
		return { date: iso(d), tminC: tmin, tmaxC: tmin + 6 + 10 * rnd() };
	});
	return Array.from({ length: count }, () => {
		// A season's rise and fall: a bell curve in time with a random peak and timing.
		const peak = 5 + 1500 * rnd() ** 2;
		const peakDay = days * (0.4 + 0.8 * rnd());
		const width = days * (0.2 + 0.3 * rnd());
		const vs: VisitInput[] = [];
		for (let v = 0; v < visits; v++) {
			const density = peak * Math.exp(-(((v * 5 - peakDay) / width) ** 2));
			const units = new Array(stops);
			// Clumped counts: an exponential spread around the block mean.
			for (let u = 0; u < stops; u++) {
				units[u] = { aphids: Math.floor(density * -Math.log(1 - rnd() * 0.999)) };
			}
			vs.push({
				date: iso(v * 5),
				bbch: 61 + Math.min(v, 18),
				sampleUnit: 'plant',
				units,
				mummies: Math.floor(density * rnd() * 0.1)
			});
		}
		return {
			asOf: iso((visits - 1) * 5 + 1),
			crop,
			pest,
			thresholds: THRESHOLDS,
			block: {
				areaHa: 10 + 50 * rnd(),
				plantsPerHa: 350_000,
				expectedYieldKgHa: 3200,
				pricePerKg: 0.45,
				rescoutDays: 5
			},
			visits: vs,
			weather
		};
	});
}

/** Runs the bench and prints blocks per second and total time. */
export function main(
	count = 10_000,
	visits = 20,
	stops = 30
): { blocksPerSecond: number; totalMs: number; cpuMs: number } {
	const rnd = mulberry32(42);
	// Warm the JIT as a running server would be.
	for (const b of makeBlocks(mulberry32(7), 1000, visits, stops)) assessBlock(b);
	const levels: Record<string, number> = {};
	let totalMs = 0;
	let cpuMs = 0;
	// Blocks are made in chunks outside the timed part, so the live heap stays server-sized
	// rather than holding all 6 million unit objects at once.
	const chunk = 500;
	for (let done = 0; done < count; done += chunk) {
		const blocks = makeBlocks(rnd, Math.min(chunk, count - done), visits, stops);
		const t0 = performance.now();
		const c0 = process.cpuUsage();
		for (const b of blocks) {
			const a = assessBlock(b);
			levels[a.level] = (levels[a.level] ?? 0) + 1;
		}
		totalMs += performance.now() - t0;
		const c = process.cpuUsage(c0);
		cpuMs += (c.user + c.system) / 1000;
	}
	const blocksPerSecond = (count / totalMs) * 1000;
	console.log(
		`engine: ${count} blocks x ${visits} visits x ${stops} stops in ${totalMs.toFixed(0)} ms wall, ${cpuMs.toFixed(0)} ms CPU`
	);
	console.log(`engine: ${blocksPerSecond.toFixed(0)} blocks/s; levels ${JSON.stringify(levels)}`);
	return { blocksPerSecond, totalMs, cpuMs };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();

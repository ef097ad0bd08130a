/** A small seeded PRNG (mulberry32) so the demo scenario is the same on every machine. */
export function rng(seed: number) {
	let a = seed >>> 0;
	const next = () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	const normal = () => {
		const u = Math.max(next(), 1e-12);
		return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * next());
	};
	// Marsaglia and Tsang's gamma sampler, for shape >= 1 (boosted below 1).
	const gamma = (shape: number): number => {
		if (shape < 1) return gamma(shape + 1) * Math.pow(next(), 1 / shape);
		const d = shape - 1 / 3;
		const c = 1 / Math.sqrt(9 * d);
		for (;;) {
			const x = normal();
			const v = Math.pow(1 + c * x, 3);
			if (v > 0 && Math.log(next()) < 0.5 * x * x + d - d * v + d * Math.log(v)) return d * v;
		}
	};
	const poisson = (mean: number): number => {
		if (mean <= 0) return 0;
		if (mean > 50) return Math.max(0, Math.round(mean + Math.sqrt(mean) * normal()));
		const l = Math.exp(-mean);
		let k = 0;
		let p = 1;
		do {
			k++;
			p *= next();
		} while (p > l);
		return k - 1;
	};
	/** Negative-binomial count with mean m and aggregation k (a gamma-Poisson mixture). */
	const negbin = (m: number, k: number) => poisson(gamma(k) * (m / k));
	return {
		next,
		normal,
		poisson,
		negbin,
		int: (lo: number, hi: number) => lo + Math.floor(next() * (hi - lo + 1))
	};
}
export type Rng = ReturnType<typeof rng>;

// Own implementations so the engine stays dependency-free in the browser; tests cross-check
// them against jstat and simple-statistics.

const LANCZOS = [
	676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
	12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7
];

/** Natural log of the gamma function (Lanczos, g = 7), for x > 0. */
export function lnGamma(x: number): number {
	if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - lnGamma(1 - x);
	const z = x - 1;
	let a = 0.99999999999980993;
	const t = z + 7.5;
	for (let i = 0; i < 8; i++) a += LANCZOS[i] / (z + i + 1);
	return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

// Continued fraction for the incomplete beta (modified Lentz).
function betaCf(x: number, a: number, b: number): number {
	const tiny = 1e-300;
	let c = 1;
	let d = 1 - ((a + b) * x) / (a + 1);
	d = Math.abs(d) < tiny ? 1 / tiny : 1 / d;
	let h = d;
	for (let m = 1; m <= 300; m++) {
		const m2 = 2 * m;
		let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
		d = 1 + aa * d;
		d = Math.abs(d) < tiny ? 1 / tiny : 1 / d;
		c = 1 + aa / c;
		c = Math.abs(c) < tiny ? tiny : c;
		h *= d * c;
		aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
		d = 1 + aa * d;
		d = Math.abs(d) < tiny ? 1 / tiny : 1 / d;
		c = 1 + aa / c;
		c = Math.abs(c) < tiny ? tiny : c;
		const del = d * c;
		h *= del;
		if (Math.abs(del - 1) < 1e-15) break;
	}
	return h;
}

/** Regularised incomplete beta I_x(a, b). */
export function incBeta(x: number, a: number, b: number): number {
	if (x <= 0) return 0;
	if (x >= 1) return 1;
	const lnFront = lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log(1 - x);
	if (x < (a + 1) / (a + b + 2)) return (Math.exp(lnFront) * betaCf(x, a, b)) / a;
	return 1 - (Math.exp(lnFront) * betaCf(1 - x, b, a)) / b;
}

/** Cumulative Student t distribution. */
export function tCdf(t: number, df: number): number {
	const tail = 0.5 * incBeta(df / (df + t * t), df / 2, 0.5);
	return t >= 0 ? 1 - tail : tail;
}

const quantileCache = new Map<string, number>();
// The 95 % CI asks for p = 0.975 at small whole df on every visit: an array beats a string key.
const t975: number[] = [];

/** Student t quantile for probability p in (0, 1), by bisection on tCdf; cached. */
export function tQuantile(p: number, df: number): number {
	if (p === 0.5) return 0;
	if (p < 0.5) return -tQuantile(1 - p, df);
	const fast = p === 0.975 && Number.isInteger(df) && df < 1000;
	if (fast && t975[df] !== undefined) return t975[df];
	const key = `${p}|${df}`;
	const hit = quantileCache.get(key);
	if (hit !== undefined) return hit;
	let lo = 0;
	let hi = 2;
	while (tCdf(hi, df) < p && hi < 1e12) hi *= 2;
	for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
		const mid = (lo + hi) / 2;
		if (tCdf(mid, df) < p) lo = mid;
		else hi = mid;
	}
	const q = (lo + hi) / 2;
	if (fast) t975[df] = q;
	else if (quantileCache.size < 10_000) quantileCache.set(key, q);
	return q;
}

export interface LinearFit {
	n: number;
	slope: number;
	intercept: number;
	/** Standard error of the slope; null with fewer than 3 points. */
	seSlope: number | null;
	r2: number | null;
	meanX: number;
	sxx: number;
}

/** Ordinary least squares y = intercept + slope x; null when x does not vary. */
export function linearFit(
	xs: ArrayLike<number>,
	ys: ArrayLike<number>,
	n = xs.length
): LinearFit | null {
	if (n < 2) return null;
	let sx = 0;
	let sy = 0;
	for (let i = 0; i < n; i++) {
		sx += xs[i];
		sy += ys[i];
	}
	const mx = sx / n;
	const my = sy / n;
	let sxx = 0;
	let sxy = 0;
	let syy = 0;
	for (let i = 0; i < n; i++) {
		const dx = xs[i] - mx;
		const dy = ys[i] - my;
		sxx += dx * dx;
		sxy += dx * dy;
		syy += dy * dy;
	}
	if (!(sxx > 0)) return null;
	const slope = sxy / sxx;
	const sse = Math.max(0, syy - slope * sxy);
	const seSlope = n > 2 ? Math.sqrt(sse / (n - 2) / sxx) : null;
	const r2 = syy > 0 ? 1 - sse / syy : null;
	return { n, slope, intercept: my - slope * mx, seSlope, r2, meanX: mx, sxx };
}

/** z for a two-sided 95 % interval (computed, the normal 0.975 quantile). */
export const Z975 = 1.959963984540054;

/** Wilson score 95 % interval for a proportion; sensible at 0 and at n. */
export function wilson95(k: number, n: number): [number, number] {
	const p = k / n;
	const z2 = Z975 * Z975;
	const den = 1 + z2 / n;
	const centre = (p + z2 / (2 * n)) / den;
	const half = (Z975 * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / den;
	return [k === 0 ? 0 : Math.max(0, centre - half), k === n ? 1 : Math.min(1, centre + half)];
}

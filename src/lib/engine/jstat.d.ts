// jstat ships no types; tests use only these functions to cross-check the engine.
declare module 'jstat' {
	const jStat: {
		studentt: { inv(p: number, df: number): number; cdf(t: number, df: number): number };
		ibeta(x: number, a: number, b: number): number;
	};
	export default jStat;
}

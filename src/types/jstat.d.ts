// The parts of jstat (a dev-only reference library for the engine's tests) that are used.
declare module 'jstat' {
	const jStat: {
		studentt: { inv(p: number, dof: number): number; cdf(x: number, dof: number): number };
		ibeta(x: number, a: number, b: number): number;
	};
	export default jStat;
}

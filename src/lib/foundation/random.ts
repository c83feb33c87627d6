// The one seeded pseudo-random generator of the project (Monte Carlo bands, simulated fields in
// tests and benchmarks, the invented demo data). Math.random cannot be seeded, so a result could
// never be reproduced or shared. mulberry32 (a public-domain 32-bit generator; from memory) uses
// only 32-bit integer operations (Math.imul, shifts), which every JavaScript engine evaluates
// exactly, so one seed gives the same numbers in the browser, on the server and in the seed script.
// Its period is 2^32; one site chart draws about 2,000 × 7 numbers, far below that.

/** A seeded generator: uniform [0, 1) and standard normal draws. */
export interface Random {
	/** Uniform on [0, 1) with 32 bits of resolution (a bound function: `const u = r.uniform`). */
	uniform: () => number;
	/** Standard normal N(0, 1) by the Box–Muller transform (Box & Muller 1958). */
	normal: () => number;
}

/** Creates a generator from a seed (any number; non-integers are truncated, reduced to 32 bits). */
export function createRandom(seed: number): Random {
	let a = Number.isFinite(seed) ? Math.trunc(seed) >>> 0 : 0;
	const uniform = () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
	let spare: number | null = null;
	const normal = () => {
		if (spare !== null) {
			const s = spare;
			spare = null;
			return s;
		}
		let u = 0;
		while (u === 0) u = uniform(); // keeps the logarithm finite
		const v = uniform();
		const r = Math.sqrt(-2 * Math.log(u));
		spare = r * Math.sin(2 * Math.PI * v);
		return r * Math.cos(2 * Math.PI * v);
	};
	return { uniform, normal };
}

// Seeded pseudo-random numbers for reproducible Monte Carlo. Math.random cannot be seeded, so a
// result could never be reproduced or shared. xoshiro128** (Blackman & Vigna 2018, "Scrambled
// linear pseudorandom number generators") uses only 32-bit integer operations (Math.imul, shifts),
// which every JavaScript engine evaluates exactly, so one seed gives the same bands in the browser
// and on the server; its period 2^128 − 1 is far beyond any run, and it is fast.

/** A seeded generator: uniform [0, 1) and standard normal draws. */
export interface Random {
	/** Uniform on [0, 1) with 32 bits of resolution. */
	uniform(): number;
	/** Standard normal N(0, 1) (Box & Muller 1958). */
	normal(): number;
}

/** MurmurHash3's 32-bit finaliser (Appleby): spreads a seed so nearby seeds give unrelated states. */
function mix32(h: number): number {
	h ^= h >>> 16;
	h = Math.imul(h, 0x85ebca6b);
	h ^= h >>> 13;
	h = Math.imul(h, 0xc2b2ae35);
	h ^= h >>> 16;
	return h >>> 0;
}

/** Creates a xoshiro128** generator from an integer seed (any number; it is reduced to 32 bits). */
export function createRandom(seed: number): Random {
	const s32 = Number.isFinite(seed) ? Math.trunc(seed) >>> 0 : 0;
	let s0 = mix32(s32 + 0x9e3779b9);
	let s1 = mix32(s32 + 0x3c6ef372);
	let s2 = mix32(s32 + 0xdaa66d2b);
	let s3 = mix32(s32 + 0x78dde6e4);
	if ((s0 | s1 | s2 | s3) === 0) s0 = 1; // the all-zero state is a fixed point

	function next32(): number {
		const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9);
		const t = s1 << 9;
		s2 ^= s0;
		s3 ^= s1;
		s1 ^= s2;
		s0 ^= s3;
		s2 ^= t;
		s3 = rotl(s3, 11);
		return result >>> 0;
	}

	let spare = NaN;
	return {
		uniform: () => next32() / 4294967296,
		normal() {
			if (!Number.isNaN(spare)) {
				const v = spare;
				spare = NaN;
				return v;
			}
			// Box–Muller with u1 in (0, 1) so the logarithm stays finite.
			const u1 = (next32() + 0.5) / 4294967296;
			const u2 = next32() / 4294967296;
			const r = Math.sqrt(-2 * Math.log(u1));
			spare = r * Math.sin(2 * Math.PI * u2);
			return r * Math.cos(2 * Math.PI * u2);
		}
	};
}

function rotl(x: number, k: number): number {
	return (x << k) | (x >>> (32 - k));
}

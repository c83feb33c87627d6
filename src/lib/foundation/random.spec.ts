import { describe, expect, it } from 'vitest';
import { createRandom } from './random';
import { expectClose } from './testing';

// Statistical checks with tolerances of several standard errors (common practice, no source).
describe('seeded generator (mulberry32, from memory; Box & Muller 1958 for normals)', () => {
	it('repeats a sequence for a seed and differs between seeds', () => {
		const a = createRandom(123);
		const b = createRandom(123);
		const c = createRandom(124);
		const seqA = Array.from({ length: 20 }, () => a.uniform());
		expect(Array.from({ length: 20 }, () => b.uniform())).toEqual(seqA);
		expect(Array.from({ length: 20 }, () => c.uniform())).not.toEqual(seqA);
	});

	it('reduces any seed to 32 bits: fractions are truncated, non-finite seeds act as 0', () => {
		const first = (seed: number) => createRandom(seed).uniform();
		expect(first(7.9)).toBe(first(7));
		expect(first(2 ** 32 + 5)).toBe(first(5));
		expect(first(NaN)).toBe(first(0));
		expect(first(Infinity)).toBe(first(0));
	});

	it('hands out uniform as a standalone function and keeps one stream for uniform and normal', () => {
		const a = createRandom(5);
		const u = a.uniform;
		const b = createRandom(5);
		expect([u(), u()]).toEqual([b.uniform(), b.uniform()]);
		a.normal(); // consumes two uniforms, keeps its pair's second value
		b.uniform();
		b.uniform();
		expect(a.uniform()).toBe(b.uniform());
	});

	it('draws uniforms in [0, 1) with mean 1/2 and variance 1/12, evenly over 10 bins', () => {
		const r = createRandom(9);
		const n = 200_000;
		const bins = new Array(10).fill(0);
		let s = 0;
		let s2 = 0;
		let outside = 0; // one assertion after the loop: 200,000 expect() calls time out on a busy CI
		for (let i = 0; i < n; i++) {
			const u = r.uniform();
			if (!(u >= 0 && u < 1)) outside++;
			s += u;
			s2 += u * u;
			bins[Math.floor(u * 10)]++;
		}
		expect(outside).toBe(0);
		expectClose(s / n, 0.5, { abs: 5 * Math.sqrt(1 / 12 / n) }, 'mean');
		expectClose(s2 / n - (s / n) ** 2, 1 / 12, { abs: 0.002 }, 'variance');
		// χ² with 9 degrees of freedom: the 99.9 % point is 27.9 (A&S Table 26.8, from memory).
		const chi2 = bins.reduce((acc, b) => acc + (b - n / 10) ** 2 / (n / 10), 0);
		expect(chi2).toBeLessThan(27.9);
	});

	it('draws standard normals: mean 0, sd 1, 10 % below −1.2816', () => {
		const r = createRandom(77);
		const n = 200_000;
		let s = 0;
		let s2 = 0;
		let below = 0;
		for (let i = 0; i < n; i++) {
			const g = r.normal();
			s += g;
			s2 += g * g;
			if (g < -1.2815515655) below++;
		}
		expectClose(s / n, 0, { abs: 5 / Math.sqrt(n) }, 'mean');
		expectClose(Math.sqrt(s2 / n), 1, { abs: 0.01 }, 'sd');
		expectClose(below / n, 0.1, { abs: 5 * Math.sqrt(0.09 / n) }, 'lower decile');
	});
});

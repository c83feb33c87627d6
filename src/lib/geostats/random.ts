import { GeostatsInputError } from './errors';
import { cholesky } from './linalg';
import { covarianceFunction } from './variogram';
import { validateVariogram } from './validate';
import type { Sample, Variogram } from './types';

/**
 * Seeded PRNG (mulberry32, a public-domain 32-bit generator; from memory) returning a
 * function of uniform numbers in [0, 1). For reproducible tests and benchmarks, not crypto.
 */
export function mulberry32(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Standard normal deviates by the Box–Muller transform (Box & Muller 1958). */
export function normalGenerator(uniform: () => number): () => number {
	let spare: number | null = null;
	return () => {
		if (spare !== null) {
			const s = spare;
			spare = null;
			return s;
		}
		let u = 0;
		while (u === 0) u = uniform();
		const v = uniform();
		const r = Math.sqrt(-2 * Math.log(u));
		spare = r * Math.sin(2 * Math.PI * v);
		return r * Math.cos(2 * Math.PI * v);
	};
}

/**
 * Draws one realisation of a zero-mean stationary Gaussian field with variogram v at the
 * given points (metres), plus `mean`, by z = mean + L e with C = L Lᵀ (Cholesky) and e ~ N(0, I).
 * O(n³): meant for a few hundred points in tests. The nugget enters as white noise.
 */
export function simulateGaussianField(
	points: { x: number; y: number }[],
	v: Variogram,
	seed: number,
	mean = 0
): Sample[] {
	validateVariogram(v);
	const n = points.length;
	const cov = covarianceFunction(v);
	const c = new Float64Array(n * n);
	for (let i = 0; i < n; i++) {
		for (let j = 0; j <= i; j++) {
			const h = Math.hypot(points[i].x - points[j].x, points[i].y - points[j].y);
			// Distinct points at distance 0 would make C singular; i === j is the diagonal.
			const value = i === j ? cov(0) : cov(h === 0 ? Number.MIN_VALUE : h);
			c[i * n + j] = value;
			c[j * n + i] = value;
		}
	}
	if (!cholesky(c, n)) {
		throw new GeostatsInputError(
			'points',
			points,
			'give a covariance matrix that is not positive definite'
		);
	}
	const normal = normalGenerator(mulberry32(seed));
	const e = new Float64Array(n);
	for (let i = 0; i < n; i++) e[i] = normal();
	const out: Sample[] = [];
	for (let i = 0; i < n; i++) {
		let s = mean;
		for (let k = 0; k <= i; k++) s += c[i * n + k] * e[k];
		out.push({ x: points[i].x, y: points[i].y, value: s });
	}
	return out;
}

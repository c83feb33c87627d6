// Simulated Gaussian random fields, for tests and benchmarks (the generator is the shared one).
import { InputError } from '../foundation/errors';
import { createRandom } from '../foundation/random';
import { cholesky } from './linalg';
import { covarianceFunction } from './variogram';
import { validateVariogram } from './validate';
import type { Sample, Variogram } from './types';

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
		throw new InputError(
			'points',
			points,
			'give a covariance matrix that is not positive definite'
		);
	}
	const normal = createRandom(seed).normal;
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

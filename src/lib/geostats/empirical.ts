import { InputError } from '../foundation/errors';
import { requirePositive, requirePositiveInteger } from '../foundation/validate';
import { validateSamples } from './validate';
import type { Sample, VariogramPoint } from './types';

/** Number of lag classes used when `lags` is omitted. */
export const DEFAULT_LAGS = 15;

/**
 * Default lag classes when lagM / lags are omitted: the maximum lag is half the diagonal
 * of the samples' bounding box (common practice, no source: beyond it few pairs span the
 * whole area and the estimate becomes erratic), split into DEFAULT_LAGS classes.
 */
export function defaultLagClasses(
	samples: Sample[],
	opts: { lagM?: number; lags?: number } = {}
): { lagM: number; lags: number } {
	const lags =
		opts.lags === undefined ? DEFAULT_LAGS : requirePositiveInteger('opts.lags', opts.lags);
	if (opts.lagM !== undefined) return { lagM: requirePositive('opts.lagM', opts.lagM), lags };
	let xMin = Infinity;
	let xMax = -Infinity;
	let yMin = Infinity;
	let yMax = -Infinity;
	for (const s of samples) {
		if (s.x < xMin) xMin = s.x;
		if (s.x > xMax) xMax = s.x;
		if (s.y < yMin) yMin = s.y;
		if (s.y > yMax) yMax = s.y;
	}
	const half = Math.hypot(xMax - xMin, yMax - yMin) / 2;
	if (!(half > 0)) {
		throw new InputError('samples', samples, 'all lie at one location; no lags to form');
	}
	return { lagM: half / lags, lags };
}

/**
 * Empirical (Matheron 1963) semivariogram: γ̂(k) = Σ (zᵢ − zⱼ)² / (2 N(k)) over the N(k)
 * pairs whose distance h lies in class k = [k·lagM, (k+1)·lagM), k = 0 … lags − 1; hM is
 * the mean pair distance in the class (m). Pairs at h ≥ lags·lagM are ignored, empty
 * classes are omitted, and pairs at h = 0 (co-located samples) fall in class 0.
 * Sample sigmas are not used: measurement error shows up in the nugget.
 */
export function empiricalVariogram(
	samples: Sample[],
	opts: { lagM: number; lags: number }
): VariogramPoint[] {
	validateSamples(samples, 2);
	if (opts === null || typeof opts !== 'object') {
		throw new InputError('opts', opts, 'must be an object with lagM and lags');
	}
	const lagM = requirePositive('opts.lagM', opts.lagM);
	const lags = requirePositiveInteger('opts.lags', opts.lags);
	const n = samples.length;
	const xs = Float64Array.from(samples, (s) => s.x);
	const ys = Float64Array.from(samples, (s) => s.y);
	const zs = Float64Array.from(samples, (s) => s.value);
	const count = new Float64Array(lags);
	const sumH = new Float64Array(lags);
	const sumSq = new Float64Array(lags);
	const maxH = lags * lagM;
	for (let a = 0; a < n; a++) {
		for (let b = a + 1; b < n; b++) {
			const h = Math.hypot(xs[a] - xs[b], ys[a] - ys[b]);
			if (h >= maxH) continue;
			const k = Math.min(lags - 1, Math.floor(h / lagM));
			const dz = zs[a] - zs[b];
			count[k]++;
			sumH[k] += h;
			sumSq[k] += dz * dz;
		}
	}
	const out: VariogramPoint[] = [];
	for (let k = 0; k < lags; k++) {
		if (count[k] === 0) continue;
		out.push({ hM: sumH[k] / count[k], gamma: sumSq[k] / (2 * count[k]), pairs: count[k] });
	}
	return out;
}

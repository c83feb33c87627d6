import { InputError } from '../foundation/errors';
import { requirePositive, requirePositiveInteger } from '../foundation/validate';
import { validateSamples } from './validate';
import { createRandom } from '../foundation/random';
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
 * Above this many pairs the empirical variogram uses a seeded random subsample of about this
 * many pairs instead of all n(n − 1)/2 (from about 1,400 sites). Common practice, no source:
 * with 15 lag classes this leaves ~6·10⁴ pairs per class, far more than the 30–50 per class
 * usually asked for, so the class means barely move (fit.spec.ts states the tolerance on the
 * reference fixtures), while a grid of 100,000 sites no longer visits 5·10⁹ pairs.
 */
export const MAX_VARIOGRAM_PAIRS = 1_000_000;

/** Fixed seed of the pair subsample, so the same sites always give the same variogram. */
const PAIR_SEED = 0x5eed_9a17;

/**
 * Empirical (Matheron 1963) semivariogram: γ̂(k) = Σ (zᵢ − zⱼ)² / (2 N(k)) over the N(k)
 * pairs whose distance h lies in class k = [k·lagM, (k+1)·lagM), k = 0 … lags − 1; hM is
 * the mean pair distance in the class (m). Pairs at h ≥ lags·lagM are ignored, empty
 * classes are omitted, and pairs at h = 0 (co-located samples) fall in class 0.
 * Sample sigmas are not used: measurement error shows up in the nugget.
 *
 * Pairs: all of them when n(n − 1)/2 ≤ maxPairs (default MAX_VARIOGRAM_PAIRS); otherwise each
 * pair is kept independently with probability maxPairs / (n(n − 1)/2) (Bernoulli sampling,
 * drawn with geometric skips so only kept pairs are visited; seeded, hence deterministic).
 * `pairs` then counts the kept pairs.
 */
export function empiricalVariogram(
	samples: Sample[],
	opts: { lagM: number; lags: number; maxPairs?: number }
): VariogramPoint[] {
	validateSamples(samples, 2);
	if (opts === null || typeof opts !== 'object') {
		throw new InputError('opts', opts, 'must be an object with lagM and lags');
	}
	const lagM = requirePositive('opts.lagM', opts.lagM);
	const lags = requirePositiveInteger('opts.lags', opts.lags);
	const maxPairs =
		opts.maxPairs === undefined
			? MAX_VARIOGRAM_PAIRS
			: requirePositiveInteger('opts.maxPairs', opts.maxPairs);
	const n = samples.length;
	const xs = Float64Array.from(samples, (s) => s.x);
	const ys = Float64Array.from(samples, (s) => s.y);
	const zs = Float64Array.from(samples, (s) => s.value);
	const count = new Float64Array(lags);
	const sumH = new Float64Array(lags);
	const sumSq = new Float64Array(lags);
	const maxH = lags * lagM;
	const last = lags - 1;
	const total = (n * (n - 1)) / 2;
	if (total <= maxPairs) {
		// Every pair; a flat loop (sqrt of the squared distance, no hypot), as this is n²/2 pairs.
		for (let a = 0; a < n; a++) {
			const xa = xs[a];
			const ya = ys[a];
			const za = zs[a];
			for (let b = a + 1; b < n; b++) {
				const ex = xa - xs[b];
				const ey = ya - ys[b];
				const h = Math.sqrt(ex * ex + ey * ey);
				if (h >= maxH) continue;
				let k = Math.floor(h / lagM);
				if (k > last) k = last;
				const dz = za - zs[b];
				count[k]++;
				sumH[k] += h;
				sumSq[k] += dz * dz;
			}
		}
	} else {
		// Pair number p (0 … total − 1) runs row by row: row a holds (a, a+1) … (a, n−1). The gap
		// to the next kept pair is geometric, ⌊ln U / ln(1 − f)⌋ (inversion, U uniform on (0, 1]).
		const uniform = createRandom(PAIR_SEED).uniform;
		const lnKeep = Math.log1p(-maxPairs / total);
		const skip = () => Math.floor(Math.log(1 - uniform()) / lnKeep);
		let a = 0;
		let rowStart = 0;
		let rowLen = n - 1;
		for (let p = skip(); p < total; p += 1 + skip()) {
			while (p >= rowStart + rowLen) {
				rowStart += rowLen;
				a++;
				rowLen--;
			}
			const b = a + 1 + (p - rowStart);
			const ex = xs[a] - xs[b];
			const ey = ys[a] - ys[b];
			const h = Math.sqrt(ex * ex + ey * ey);
			if (h >= maxH) continue;
			let k = Math.floor(h / lagM);
			if (k > last) k = last;
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

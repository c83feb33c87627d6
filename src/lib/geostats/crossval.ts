import { SingularSystemError } from './errors';
import { invert } from './linalg';
import { LocalKriger, prepareKriging, type PreparedSamples } from './kriging';
import { NeighbourIndex } from './neighbours';
import type { Sample, Variogram } from './types';
import { optionalNeighbours } from './validate';

/** Leave-one-out result for sample i: estimate − observed, and that error's variance. */
export interface CrossValidationResidual {
	estimate: number;
	error: number;
	variance: number;
}

/**
 * Leave-one-out residuals (value units): each sample is kriged from the others.
 * `error` = estimate − observed; `variance` = kriging variance + the sample's own σᵢ²,
 * i.e. the variance of that error, so error/√variance is standard normal if the model holds.
 */
export function crossValidationResiduals(
	samples: Sample[],
	v: Variogram,
	opts?: { maxNeighbours?: number }
): CrossValidationResidual[] {
	const p = prepareKriging(samples, v);
	const k = optionalNeighbours('opts.maxNeighbours', opts?.maxNeighbours);
	if (k === undefined || k >= p.n - 1) return dubrule(p);
	const index = new NeighbourIndex(p.xs, p.ys);
	const solver = new LocalKriger(p, k);
	const idx = new Int32Array(k + 1);
	const d2 = new Float64Array(k + 1);
	const out = new Array<CrossValidationResidual>(p.n);
	// Sites in the k-d tree's order, so consecutive neighbour sets share most samples and the
	// solver copies their covariances; each result is independent of the order (kriging.ts).
	for (const i of index.spatialOrder()) {
		const found = index.nearest(p.xs[i], p.ys[i], k + 1, Infinity, idx, d2);
		// Drop sample i itself (or, if k + 1 others tie at distance 0, the farthest one).
		let w = 0;
		for (let q = 0; q < found; q++) {
			if (idx[q] === i) continue;
			if (w === k) break;
			idx[w] = idx[q];
			d2[w] = d2[q];
			w++;
		}
		const r = solver.solve(p.xs[i], p.ys[i], idx, d2, w);
		out[i] = { estimate: r.value, error: r.value - p.zs[i], variance: r.variance + p.noise[i] };
	}
	return out;
}

/**
 * Unique-neighbourhood leave-one-out in one O(n³) inversion (Dubrule 1983): with K the
 * bordered kriging matrix of all samples and B = K⁻¹, the error of predicting zᵢ from the
 * others is zᵢ − ẑ₋ᵢ = (B [z; 0])ᵢ / Bᵢᵢ and its variance is 1 / Bᵢᵢ. The spec file
 * checks this against brute-force refits.
 */
function dubrule(p: PreparedSamples): CrossValidationResidual[] {
	const n = p.n;
	const m = n + 1;
	const a = new Float64Array(m * m);
	for (let r = 0; r < n; r++) {
		a[r * m + r] = p.sill + p.noise[r];
		for (let c = 0; c < r; c++) {
			const cv = p.cov(Math.hypot(p.xs[c] - p.xs[r], p.ys[c] - p.ys[r]));
			a[r * m + c] = cv;
			a[c * m + r] = cv;
		}
		a[r * m + n] = 1;
		a[n * m + r] = 1;
	}
	const b = invert(a, m);
	if (b === null) {
		throw new SingularSystemError(
			'kriging system with all samples is singular',
			Array.from({ length: n }, (_, q) => q)
		);
	}
	const out: CrossValidationResidual[] = [];
	for (let i = 0; i < n; i++) {
		let s = 0;
		for (let c = 0; c < n; c++) s += b[i * m + c] * p.zs[c];
		const bii = b[i * m + i];
		const residual = s / bii; // observed − estimate
		out.push({ estimate: p.zs[i] - residual, error: -residual, variance: 1 / bii });
	}
	return out;
}

/**
 * Leave-one-out cross-validation summary (Cressie 1993, §2.6.4): RMSE and mean error in
 * value units, mean standardised error (dimensionless, ≈ 0 if unbiased) and the RMS
 * standardised error (≈ 1 if the kriging σ is right). error = estimate − observed.
 */
export function crossValidate(
	samples: Sample[],
	v: Variogram,
	opts?: { maxNeighbours?: number }
): {
	rmse: number;
	meanError: number;
	meanStandardisedError: number;
	rmsStandardisedError: number;
} {
	const res = crossValidationResiduals(samples, v, opts);
	let se = 0;
	let sse = 0;
	let sz = 0;
	let szz = 0;
	for (const r of res) {
		se += r.error;
		sse += r.error * r.error;
		const z = r.variance > 0 ? r.error / Math.sqrt(r.variance) : 0;
		sz += z;
		szz += z * z;
	}
	const n = res.length;
	return {
		rmse: Math.sqrt(sse / n),
		meanError: se / n,
		meanStandardisedError: sz / n,
		rmsStandardisedError: Math.sqrt(szz / n)
	};
}

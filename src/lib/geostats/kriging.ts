import { assertNoExactDuplicates } from './duplicates';
import { InputError } from '../foundation/errors';
import { SingularSystemError } from './errors';
import { choleskyLower, choleskySolve, luFactor, luSolve } from './linalg';
import { NeighbourIndex } from './neighbours';
import type { GridSpec, Sample, Variogram } from './types';
import { requireFinite } from '../foundation/validate';
import { optionalNeighbours, validateGrid, validateSamples, validateVariogram } from './validate';
import { covarianceFunction } from './variogram';

/*
 * Ordinary kriging (Matheron 1963; Cressie 1993, §3.2) in covariance form with
 * C(h) = sill − γ(h). For the n samples used at a target x₀ the system is
 *
 *   [ C + Σ  1 ] [ λ ]   [ c₀ ]
 *   [ 1ᵀ     0 ] [ μ ] = [ 1  ]     ẑ(x₀) = λᵀz,   σ²(x₀) = C(0) − λᵀc₀ − μ,
 *
 * with Cᵢⱼ = C(|xᵢ − xⱼ|), c₀ᵢ = C(|x₀ − xᵢ|) and C(0) = sill.
 *
 * Measurement error (filtered kriging; Cressie 1993, §3.2.1): each sample is taken as
 * zᵢ = S(xᵢ) + εᵢ with independent εᵢ of known variance σᵢ² (`Sample.sigma`, the 1-σ error).
 * Σ = diag(σᵢ²) is added to the diagonal of C only, c₀ and C(0) are unchanged, so ẑ
 * estimates the noise-free field S and σ² is the error variance of that estimate. A
 * sample with σᵢ > 0 is therefore no longer honoured exactly, and the larger σᵢ the less
 * it pulls the surface. The nugget stays part of S (as in gstat's "Nug"), so with σ = 0
 * the surface still passes through every sample even when the nugget is non-zero.
 */

export interface KrigingOptions {
	/** Use only the nearest this many samples per target (k-d tree); default every sample. */
	maxNeighbours?: number;
	/** Cell limit for the grid (default MAX_GRID_CELLS). */
	maxCells?: number;
}

/** Sample data unpacked into flat arrays for the inner loops. */
export interface PreparedSamples {
	n: number;
	xs: Float64Array;
	ys: Float64Array;
	zs: Float64Array;
	/** Measurement-error variance σᵢ² (0 when sigma is absent). */
	noise: Float64Array;
	cov: (hM: number) => number;
	sill: number;
}

/** Validates samples and variogram for kriging and unpacks them. */
export function prepareKriging(samples: Sample[], v: Variogram): PreparedSamples {
	validateSamples(samples, 3);
	validateVariogram(v);
	assertNoExactDuplicates(samples);
	const n = samples.length;
	const xs = new Float64Array(n);
	const ys = new Float64Array(n);
	const zs = new Float64Array(n);
	const noise = new Float64Array(n);
	for (let k = 0; k < n; k++) {
		const s = samples[k];
		xs[k] = s.x;
		ys[k] = s.y;
		zs[k] = s.value;
		noise[k] = s.sigma === undefined ? 0 : s.sigma * s.sigma;
	}
	return { n, xs, ys, zs, noise, cov: covarianceFunction(v), sill: v.nugget + v.partialSill };
}

/** Result of one kriging solve; `weights[q]` belongs to sample `indices[q]`. */
export interface PointSolution {
	value: number;
	variance: number;
	count: number;
}

/**
 * Solves kriging systems built from a chosen subset of samples. Buffers are reused, so a
 * grid of any size allocates nothing per cell.
 *
 * Speed (a 256² grid is 65,536 systems): the bordered system is solved through the Schur
 * complement of K = C + Σ, which is symmetric positive definite: with u = K⁻¹c₀ and
 * v = K⁻¹1, μ = (1ᵀu − 1) / 1ᵀv and λ = u − μv (Cressie 1993, §3.2, written out; from memory).
 * K is factorised by Cholesky (half the work of LU), and when the neighbour set is the one of
 * the previous call only u is new. Covariances between samples that were already in the
 * previous set are copied from its K instead of recomputed (neighbouring cells share most
 * neighbours). If Cholesky meets a pivot below the singularity tolerance, the cell falls back
 * to LU with partial pivoting on the bordered matrix, which then decides whether it is singular.
 */
export class LocalKriger {
	readonly weights: Float64Array;
	lagrange = 0;
	private readonly a: Float64Array;
	private readonly b: Float64Array;
	private readonly c0: Float64Array;
	private readonly piv: Int32Array;
	private readonly p: PreparedSamples;
	private readonly lastIdx: Int32Array;
	private lastCount = -1;
	/** K of the current and of the previous set (count × count, row-major), swapped on change. */
	private kNow: Float64Array;
	private kPrev: Float64Array;
	private prevCount = 0;
	/** Position of a sample in the previous set's K, or −1. */
	private readonly posOf: Int32Array;
	/** Cholesky factor of K, and v = K⁻¹1 with its sum, for the current set. */
	private readonly l: Float64Array;
	private readonly v: Float64Array;
	private sumV = 0;
	private useLu = false;

	constructor(p: PreparedSamples, maxCount: number) {
		this.p = p;
		this.lastIdx = new Int32Array(maxCount);
		const m = maxCount + 1;
		this.a = new Float64Array(m * m);
		this.b = new Float64Array(m);
		this.c0 = new Float64Array(m);
		this.piv = new Int32Array(m);
		this.weights = new Float64Array(maxCount);
		this.kNow = new Float64Array(maxCount * maxCount);
		this.kPrev = new Float64Array(maxCount * maxCount);
		this.l = new Float64Array(maxCount * maxCount);
		this.v = new Float64Array(maxCount);
		this.posOf = new Int32Array(p.n).fill(-1);
	}

	/**
	 * Kriges (x, y) in metres from samples idx[0..count); d2[q] is the squared distance to
	 * each. Sorts idx (and d2) by sample index in place, so weights[q] belongs to idx[q].
	 */
	solve(x: number, y: number, idx: Int32Array, d2: Float64Array, count: number): PointSolution {
		const { zs, cov, sill } = this.p;
		const b = this.b;
		const c0 = this.c0;
		// Insertion sort by sample index (count is small).
		for (let q = 1; q < count; q++) {
			const id = idx[q];
			const dd = d2[q];
			let r = q - 1;
			while (r >= 0 && idx[r] > id) {
				idx[r + 1] = idx[r];
				d2[r + 1] = d2[r];
				r--;
			}
			idx[r + 1] = id;
			d2[r + 1] = dd;
		}
		let same = count === this.lastCount;
		for (let q = 0; same && q < count; q++) same = idx[q] === this.lastIdx[q];
		for (let r = 0; r < count; r++) c0[r] = cov(Math.sqrt(d2[r]));
		if (!same) this.factorise(x, y, idx, count);
		let mu: number;
		if (this.useLu) {
			for (let r = 0; r < count; r++) b[r] = c0[r];
			b[count] = 1;
			luSolve(this.a, count + 1, this.piv, b);
			mu = b[count];
		} else {
			for (let r = 0; r < count; r++) b[r] = c0[r];
			choleskySolve(this.l, count, b);
			let sumU = 0;
			for (let r = 0; r < count; r++) sumU += b[r];
			mu = (sumU - 1) / this.sumV;
			const v = this.v;
			for (let r = 0; r < count; r++) b[r] -= mu * v[r];
		}
		let value = 0;
		let lc = 0;
		for (let q = 0; q < count; q++) {
			const w = b[q];
			this.weights[q] = w;
			value += w * zs[idx[q]];
			lc += w * c0[q];
		}
		this.lagrange = mu;
		const variance = Math.max(0, sill - lc - mu);
		return { value, variance, count };
	}

	/** Builds K for the sorted set idx[0..count), reusing the previous K, and factorises it. */
	private factorise(x: number, y: number, idx: Int32Array, count: number): void {
		const { xs, ys, noise, cov, sill } = this.p;
		const posOf = this.posOf;
		const k = this.kPrev; // becomes the current K; kNow holds the previous one
		const old = this.kNow;
		const oldM = this.prevCount;
		for (let r = 0; r < count; r++) {
			const ir = idx[r];
			const pr = posOf[ir];
			const xr = xs[ir];
			const yr = ys[ir];
			k[r * count + r] = sill + noise[ir];
			for (let c = 0; c < r; c++) {
				const ic = idx[c];
				const pc = posOf[ic];
				let cv: number;
				if (pr >= 0 && pc >= 0) cv = old[pr * oldM + pc];
				else {
					const ex = xs[ic] - xr;
					const ey = ys[ic] - yr;
					cv = cov(Math.sqrt(ex * ex + ey * ey));
				}
				k[r * count + c] = cv;
				k[c * count + r] = cv;
			}
		}
		for (let q = 0; q < oldM; q++) posOf[this.lastIdx[q]] = -1;
		for (let q = 0; q < count; q++) posOf[idx[q]] = q;
		this.kPrev = old;
		this.kNow = k;
		this.prevCount = count;
		for (let q = 0; q < count; q++) this.lastIdx[q] = idx[q];
		this.lastCount = count;

		const l = this.l;
		for (let q = 0; q < count * count; q++) l[q] = k[q];
		// minScale 1: the bordered matrix that LU would see holds 1s, so its tolerance is the same.
		this.useLu = !choleskyLower(l, count, 1);
		if (!this.useLu) {
			const v = this.v;
			for (let r = 0; r < count; r++) v[r] = 1;
			choleskySolve(l, count, v);
			let s = 0;
			for (let r = 0; r < count; r++) s += v[r];
			this.sumV = s;
			// 1ᵀK⁻¹1 > 0 for an SPD K; anything else means the factor is not to be trusted.
			if (s > 0 && Number.isFinite(s)) return;
			this.useLu = true;
		}
		const m = count + 1;
		const a = this.a;
		for (let r = 0; r < count; r++) {
			for (let c = 0; c < count; c++) a[r * m + c] = k[r * count + c];
			a[r * m + count] = 1;
			a[count * m + r] = 1;
		}
		a[count * m + count] = 0;
		if (!luFactor(a, m, this.piv)) {
			this.lastCount = -1;
			throw new SingularSystemError(
				`kriging system at (${x}, ${y}) is singular: samples at (nearly) the same location ` +
					'with no sigma; merge them (mergeDuplicateSamples) or give them a sigma',
				Array.from(idx.subarray(0, count))
			);
		}
	}
}

/**
 * Kriging with every sample: the (n + 1)² system does not depend on the target, so it is
 * factorised once (O(n³)) and each target costs one O(n²) solve. Practical up to roughly
 * two thousand samples; beyond that use maxNeighbours.
 */
export class GlobalKriger {
	readonly weights: Float64Array;
	lagrange = 0;
	private readonly lu: Float64Array;
	private readonly piv: Int32Array;
	private readonly b: Float64Array;
	private readonly c0: Float64Array;

	private readonly p: PreparedSamples;

	constructor(p: PreparedSamples) {
		this.p = p;
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
		this.piv = new Int32Array(m);
		if (!luFactor(a, m, this.piv)) {
			throw new SingularSystemError(
				'kriging system with all samples is singular: samples at (nearly) the same location ' +
					'with no sigma; merge them (mergeDuplicateSamples) or give them a sigma',
				Array.from({ length: n }, (_, k) => k)
			);
		}
		this.lu = a;
		this.b = new Float64Array(m);
		this.c0 = new Float64Array(n);
		this.weights = new Float64Array(n);
	}

	/** Kriges (x, y) in metres from every sample. */
	solve(x: number, y: number): PointSolution {
		const { n, xs, ys, zs, cov, sill } = this.p;
		const b = this.b;
		for (let q = 0; q < n; q++) {
			const c = cov(Math.hypot(xs[q] - x, ys[q] - y));
			b[q] = c;
			this.c0[q] = c;
		}
		b[n] = 1;
		luSolve(this.lu, n + 1, this.piv, b);
		let value = 0;
		let lc = 0;
		for (let q = 0; q < n; q++) {
			this.weights[q] = b[q];
			value += b[q] * zs[q];
			lc += b[q] * this.c0[q];
		}
		this.lagrange = b[n];
		return { value, variance: Math.max(0, sill - lc - b[n]), count: n };
	}
}

/** Writes rows j0 … j1 − 1 of a grid into full-grid arrays (index j · nx + i). */
export type KrigingRows = (
	j0: number,
	j1: number,
	value: Float64Array,
	sigma: Float64Array
) => void;

/**
 * Ordinary kriging of a grid row range at a time, with the samples checked, the k-d tree
 * built and the solver's buffers allocated once: the grid job computes strips of rows between
 * progress reports, and each strip continues where the last one stopped. A cell's result does
 * not depend on which cells were computed before it (a reused covariance is the same number
 * recomputed), so any split of the rows gives the same grid.
 */
export function krigingRows(
	samples: Sample[],
	grid: GridSpec,
	v: Variogram,
	opts?: KrigingOptions
): KrigingRows {
	const p = prepareKriging(samples, v);
	validateGrid(grid, opts?.maxCells);
	const k = optionalNeighbours('opts.maxNeighbours', opts?.maxNeighbours);
	const { nx, x0, y0, dx, dy } = grid;

	if (k === undefined || k >= p.n) {
		const solver = new GlobalKriger(p);
		return (j0, j1, value, sigma) => {
			for (let j = j0; j < j1; j++) {
				const cy = y0 + (j + 0.5) * dy;
				for (let i = 0; i < nx; i++) {
					const r = solver.solve(x0 + (i + 0.5) * dx, cy);
					value[j * nx + i] = r.value;
					sigma[j * nx + i] = Math.sqrt(r.variance);
				}
			}
		};
	}

	const index = new NeighbourIndex(p.xs, p.ys);
	const solver = new LocalKriger(p, k);
	const idx = new Int32Array(k);
	const d2 = new Float64Array(k);
	return (j0, j1, value, sigma) => {
		for (let j = j0; j < j1; j++) {
			const cy = y0 + (j + 0.5) * dy;
			for (let i = 0; i < nx; i++) {
				const cx = x0 + (i + 0.5) * dx;
				const count = index.nearest(cx, cy, k, Infinity, idx, d2);
				const r = solver.solve(cx, cy, idx, d2, count);
				value[j * nx + i] = r.value;
				sigma[j * nx + i] = Math.sqrt(r.variance);
			}
		}
	};
}

/**
 * Ordinary-kriging estimate and kriging standard error (value units) at cell centres.
 * Without maxNeighbours every sample is used; with it, the nearest maxNeighbours samples.
 */
export function ordinaryKrigingGrid(
	samples: Sample[],
	grid: GridSpec,
	v: Variogram,
	opts?: KrigingOptions
): { value: Float64Array; sigma: Float64Array } {
	const rows = krigingRows(samples, grid, v, opts);
	const value = new Float64Array(grid.nx * grid.ny);
	const sigma = new Float64Array(grid.nx * grid.ny);
	rows(0, grid.ny, value, sigma);
	return { value, sigma };
}

/**
 * Kriging at one point (x, y in metres), with the weights exposed: `weights[q]` belongs to
 * `samples[indices[q]]`; value and sigma in value units, lagrange in value-unit².
 */
export function krigePoint(
	samples: Sample[],
	v: Variogram,
	x: number,
	y: number,
	opts?: { maxNeighbours?: number }
): { value: number; sigma: number; indices: number[]; weights: number[]; lagrange: number } {
	const p = prepareKriging(samples, v);
	requireFinite('x', x);
	requireFinite('y', y);
	const k = optionalNeighbours('opts.maxNeighbours', opts?.maxNeighbours);
	if (k === undefined || k >= p.n) {
		const solver = new GlobalKriger(p);
		const r = solver.solve(x, y);
		return {
			value: r.value,
			sigma: Math.sqrt(r.variance),
			indices: Array.from({ length: p.n }, (_, q) => q),
			weights: Array.from(solver.weights),
			lagrange: solver.lagrange
		};
	}
	const index = new NeighbourIndex(p.xs, p.ys);
	const idx = new Int32Array(k);
	const d2 = new Float64Array(k);
	const count = index.nearest(x, y, k, Infinity, idx, d2);
	if (count < 1) throw new InputError('samples', samples, 'gave no neighbours');
	const solver = new LocalKriger(p, k);
	const r = solver.solve(x, y, idx, d2, count);
	return {
		value: r.value,
		sigma: Math.sqrt(r.variance),
		indices: Array.from(idx.subarray(0, count)),
		weights: Array.from(solver.weights.subarray(0, count)),
		lagrange: solver.lagrange
	};
}

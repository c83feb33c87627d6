import { InputError } from '../foundation/errors';
import { NeighbourIndex } from './neighbours';
import type { GridSpec, Sample } from './types';
import { requirePositive } from '../foundation/validate';
import { optionalNeighbours, validateGrid, validateSamples } from './validate';
import { IDW_SIMD_WASM } from './idw-simd-module';

/**
 * A sample closer than this to a cell centre (squared, m²) is a hit: the cell takes its value.
 * GDAL's invdist uses the same threshold (gdalgrid.cpp, `dfR2 < 0.0000000000001`); where GDAL
 * takes the first such sample, we take the mean of all of them, so the order of the samples
 * does not matter (the grid job merges co-located sites first, so the two agree there).
 */
export const HIT_D2 = 1e-13;

export interface IdwOptions {
	/** Exponent p of the weights 1 / dᵖ (Shepard 1968); 2 is common practice. */
	power: number;
	/** Use only the nearest this many samples. */
	maxNeighbours?: number;
	/** Use only samples within this distance (m); cells with none become NaN. */
	radiusM?: number;
	/** Cell limit for the grid (default MAX_GRID_CELLS). */
	maxCells?: number;
}

/** Writes rows j0 … j1 − 1 of a grid into a full-grid array (index j · nx + i). */
export interface IdwRows {
	(j0: number, j1: number, out: Float64Array): void;
	/**
	 * Set when the rows come from idwEverySitePower2Rows (every sample, power 2): its inputs,
	 * so a caller may run that self-contained kernel on other threads with the same result.
	 */
	everySitePower2?: IdwEverySiteInputs;
}

/** The unpacked samples idwEverySitePower2Rows reads. */
export interface IdwEverySiteInputs {
	xs: Float64Array;
	ys: Float64Array;
	zs: Float64Array;
}

/**
 * Inverse-distance-weighted grid (Shepard 1968): ẑ = Σ wᵢ zᵢ / Σ wᵢ with wᵢ = 1 / dᵢᵖ,
 * evaluated at cell centres; value units as the samples. A cell centre within √HIT_D2 of
 * samples takes their mean (IDW is exact there). Without maxNeighbours and radiusM every
 * sample is used; with them, the nearest maxNeighbours within radiusM, and NaN if none.
 */
export function inverseDistanceGrid(
	samples: Sample[],
	grid: GridSpec,
	opts: IdwOptions
): Float64Array {
	const out = new Float64Array(grid.nx * grid.ny);
	idwRows(samples, grid, opts)(0, grid.ny, out);
	return out;
}

/**
 * inverseDistanceGrid a row range at a time, with the samples checked and unpacked and the
 * k-d tree built once (the grid job computes strips of rows between progress reports). Each
 * cell depends only on the samples, so any split of the rows gives the same grid.
 */
export function idwRows(samples: Sample[], grid: GridSpec, opts: IdwOptions): IdwRows {
	validateSamples(samples, 1);
	if (opts === null || typeof opts !== 'object') {
		throw new InputError('opts', opts, 'must be an object with a power');
	}
	validateGrid(grid, opts.maxCells);
	const power = requirePositive('opts.power', opts.power);
	const k = optionalNeighbours('opts.maxNeighbours', opts.maxNeighbours);
	const radius =
		opts.radiusM === undefined ? undefined : requirePositive('opts.radiusM', opts.radiusM);

	const n = samples.length;
	const xs = new Float64Array(n);
	const ys = new Float64Array(n);
	const zs = new Float64Array(n);
	for (let s = 0; s < n; s++) {
		xs[s] = samples[s].x;
		ys[s] = samples[s].y;
		zs[s] = samples[s].value;
	}
	// Weights from squared distance: 1/dᵖ = (d²)^(−p/2); p = 2 avoids Math.pow entirely.
	const half = power / 2;
	const weight = power === 2 ? inverseSquare : (d2: number) => Math.pow(d2, -half);

	const { nx, x0, y0, dx, dy } = grid;

	if (k === undefined && radius === undefined) {
		if (power === 2) {
			const rows: IdwRows = (j0, j1, out) =>
				idwEverySitePower2Rows(xs, ys, zs, nx, x0, y0, dx, dy, j0, j1, out, IDW_SIMD_WASM);
			rows.everySitePower2 = { xs, ys, zs };
			return rows;
		}
		return (j0, j1, out) => {
			for (let j = j0; j < j1; j++) {
				const cy = y0 + (j + 0.5) * dy;
				for (let i = 0; i < nx; i++) {
					out[j * nx + i] = everySiteCell(xs, ys, zs, x0 + (i + 0.5) * dx, cy, weight);
				}
			}
		};
	}

	const index = new NeighbourIndex(xs, ys);
	const maxD = radius ?? Infinity;
	const kk = k ?? n;
	const idx = new Int32Array(Math.min(kk, n));
	const d2s = new Float64Array(Math.min(kk, n));
	return (j0, j1, out) => {
		for (let j = j0; j < j1; j++) {
			const cy = y0 + (j + 0.5) * dy;
			for (let i = 0; i < nx; i++) {
				const cx = x0 + (i + 0.5) * dx;
				let count: number;
				if (k === undefined) {
					const found = index.within(cx, cy, maxD);
					count = found.length;
					for (let q = 0; q < count; q++) {
						const s = found[q];
						idx[q] = s;
						d2s[q] = (xs[s] - cx) ** 2 + (ys[s] - cy) ** 2;
					}
				} else {
					count = index.nearest(cx, cy, kk, maxD, idx, d2s);
				}
				if (count === 0) {
					out[j * nx + i] = NaN;
					continue;
				}
				let sw = 0;
				let swz = 0;
				let exact = 0;
				let exactSum = 0;
				for (let q = 0; q < count; q++) {
					const d2 = d2s[q];
					const z = zs[idx[q]];
					if (d2 < HIT_D2) {
						exact++;
						exactSum += z;
					} else {
						const w = weight(d2);
						sw += w;
						swz += w * z;
					}
				}
				out[j * nx + i] = exact > 0 ? exactSum / exact : swz / sw;
			}
		}
	};
}

const inverseSquare = (d2: number) => 1 / d2;

/** One cell from every sample with any weight function, hits handled (the careful path). */
function everySiteCell(
	xs: Float64Array,
	ys: Float64Array,
	zs: Float64Array,
	cx: number,
	cy: number,
	weight: (d2: number) => number
): number {
	let sw = 0;
	let swz = 0;
	let exact = 0;
	let exactSum = 0;
	for (let s = 0; s < xs.length; s++) {
		const ex = xs[s] - cx;
		const ey = ys[s] - cy;
		const d2 = ex * ex + ey * ey;
		if (d2 < HIT_D2) {
			exact++;
			exactSum += zs[s];
		} else {
			const w = weight(d2);
			sw += w;
			swz += w * zs[s];
		}
	}
	return exact > 0 ? exactSum / exact : swz / sw;
}

/**
 * The hot kernel of IDW with every sample and power 2 (the grid job's default), written for
 * speed because it is n × cells pairs (5,000 × 65,536 in the benchmark):
 * - w = 1/d² from the squared distance: no sqrt, no pow;
 * - four cells of a row per pass over the samples, so each sample's x, y, z is loaded once
 *   for four cells and the four divisions are independent (the CPU overlaps them); measured
 *   about 2× faster than one cell per pass on the benchmark machine;
 * - no branch in the inner loop: a hit (d² < HIT_D2) makes a weight above 1/HIT_D2 (or
 *   Infinity at d = 0), so Σw ≥ 1/HIT_D2 flags the cell and it is recomputed by the careful
 *   loop below, which handles hits (as everySiteCell). A cell flagged without a hit gets the
 *   same weights. Same weights and sums in the same order, so the results are identical.
 *
 * - with `wasm` (IDW_SIMD_WASM from ./idw-simd-module), the fast pass runs as WebAssembly with
 *   128-bit SIMD (two doubles per operation, eight cells per pass; idw-simd.wat): the same
 *   operations in the same order, so the same bits (tested), measured 1.3–1.6× faster. Own wasm code because no npm
 *   package offers an IDW kernel with SIMD; the careful pass stays JavaScript.
 *
 * SELF-CONTAINED on purpose: it refers to nothing outside its parameters (HIT_D2 and its
 * inverse are written as literals, no helper functions, no nested functions), because the grid
 * job's threads run it from its source text (src/lib/server/grids/idw-threads.ts); a test runs
 * it in an empty context to keep it so, and another that the literals equal HIT_D2.
 */
export function idwEverySitePower2Rows(
	xs: Float64Array,
	ys: Float64Array,
	zs: Float64Array,
	nx: number,
	x0: number,
	y0: number,
	dx: number,
	dy: number,
	j0: number,
	j1: number,
	out: Float64Array,
	wasm?: Uint8Array<ArrayBuffer>
): void {
	const n = xs.length;
	// Cells of the current row whose fast sum says "maybe a hit": redone carefully.
	const careful = new Uint8Array(nx);
	// The SIMD fast pass (idw-simd.wat), when given and the runtime has WebAssembly SIMD:
	// memory holds xs, ys, zs, then one row's results and Σw. Else the JavaScript pass below.
	let simdRow: ((...a: number[]) => void) | undefined;
	let mem: Float64Array | undefined;
	if (wasm !== undefined && typeof WebAssembly === 'object') {
		try {
			const inst = new WebAssembly.Instance(new WebAssembly.Module(wasm));
			const memory = inst.exports.memory as WebAssembly.Memory;
			const bytes = (3 * n + 2 * nx) * 8;
			if (bytes > memory.buffer.byteLength) {
				memory.grow(Math.ceil((bytes - memory.buffer.byteLength) / 65536));
			}
			mem = new Float64Array(memory.buffer);
			mem.set(xs, 0);
			mem.set(ys, n);
			mem.set(zs, 2 * n);
			simdRow = inst.exports.row as (...a: number[]) => void;
		} catch {
			// No SIMD (or no room): the JavaScript pass gives the same numbers.
			simdRow = undefined;
		}
	}
	for (let j = j0; j < j1; j++) {
		const cy = y0 + (j + 0.5) * dy;
		const row = j * nx;
		let i = 0;
		if (simdRow !== undefined && mem !== undefined) {
			simdRow(n, nx, x0, dx, cy, 24 * n, 24 * n + 8 * nx);
			// The wasm pass does groups of eight; the JavaScript pass below does the rest.
			const groups = nx - (nx % 8);
			for (; i < groups; i++) {
				out[row + i] = mem[3 * n + i];
				// As below: NaN or Σw ≥ 1 / HIT_D2 means maybe a hit.
				careful[i] = mem[3 * n + nx + i] < 1 / 1e-13 ? 0 : 1;
			}
		}
		for (; i + 4 <= nx; i += 4) {
			const c0 = x0 + (i + 0.5) * dx;
			const c1 = x0 + (i + 1.5) * dx;
			const c2 = x0 + (i + 2.5) * dx;
			const c3 = x0 + (i + 3.5) * dx;
			let s0 = 0,
				s1 = 0,
				s2 = 0,
				s3 = 0,
				t0 = 0,
				t1 = 0,
				t2 = 0,
				t3 = 0;
			for (let q = 0; q < n; q++) {
				const x = xs[q];
				const ey = ys[q] - cy;
				const e2 = ey * ey;
				const z = zs[q];
				let e = x - c0;
				const w0 = 1 / (e * e + e2);
				e = x - c1;
				const w1 = 1 / (e * e + e2);
				e = x - c2;
				const w2 = 1 / (e * e + e2);
				e = x - c3;
				const w3 = 1 / (e * e + e2);
				s0 += w0;
				t0 += w0 * z;
				s1 += w1;
				t1 += w1 * z;
				s2 += w2;
				t2 += w2 * z;
				s3 += w3;
				t3 += w3 * z;
			}
			// Above Σw = 1 / HIT_D2 a cell may hold a hit (w = 1/d² > 1/HIT_D2): written out, see above.
			careful[i] = s0 < 1 / 1e-13 ? 0 : 1;
			careful[i + 1] = s1 < 1 / 1e-13 ? 0 : 1;
			careful[i + 2] = s2 < 1 / 1e-13 ? 0 : 1;
			careful[i + 3] = s3 < 1 / 1e-13 ? 0 : 1;
			out[row + i] = t0 / s0;
			out[row + i + 1] = t1 / s1;
			out[row + i + 2] = t2 / s2;
			out[row + i + 3] = t3 / s3;
		}
		for (; i < nx; i++) careful[i] = 1;
		for (i = 0; i < nx; i++) {
			if (careful[i] === 0) continue;
			// The careful cell, as everySiteCell with w = 1/d²: hits (d² < HIT_D2) give their mean.
			const cx = x0 + (i + 0.5) * dx;
			let sw = 0;
			let swz = 0;
			let exact = 0;
			let exactSum = 0;
			for (let s = 0; s < n; s++) {
				const ex = xs[s] - cx;
				const ey = ys[s] - cy;
				const d2 = ex * ex + ey * ey;
				if (d2 < 1e-13) {
					exact++;
					exactSum += zs[s];
				} else {
					const w = 1 / d2;
					sw += w;
					swz += w * zs[s];
				}
			}
			out[row + i] = exact > 0 ? exactSum / exact : swz / sw;
		}
	}
}

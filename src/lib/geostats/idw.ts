import { InputError } from '../foundation/errors';
import { NeighbourIndex } from './neighbours';
import type { GridSpec, Sample } from './types';
import { requirePositive } from '../foundation/validate';
import { optionalNeighbours, validateGrid, validateSamples } from './validate';

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

/**
 * Inverse-distance-weighted grid (Shepard 1968): ẑ = Σ wᵢ zᵢ / Σ wᵢ with wᵢ = 1 / dᵢᵖ,
 * evaluated at cell centres; value units as the samples. A cell centre that coincides with
 * samples takes their mean (IDW is exact there). Without maxNeighbours and radiusM every
 * sample is used; with them, the nearest maxNeighbours within radiusM, and NaN if none.
 */
export function inverseDistanceGrid(
	samples: Sample[],
	grid: GridSpec,
	opts: IdwOptions
): Float64Array {
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
	const weight = power === 2 ? (d2: number) => 1 / d2 : (d2: number) => Math.pow(d2, -half);

	const { nx, ny, x0, y0, dx, dy } = grid;
	const out = new Float64Array(nx * ny);

	if (k === undefined && radius === undefined) {
		for (let j = 0; j < ny; j++) {
			const cy = y0 + (j + 0.5) * dy;
			for (let i = 0; i < nx; i++) {
				const cx = x0 + (i + 0.5) * dx;
				let sw = 0;
				let swz = 0;
				let exact = 0;
				let exactSum = 0;
				if (power === 2) {
					// Hot loop for the common power: inlined 1/d² (2–3× faster than the callback).
					for (let s = 0; s < n; s++) {
						const ex = xs[s] - cx;
						const ey = ys[s] - cy;
						const d2 = ex * ex + ey * ey;
						if (d2 === 0) {
							exact++;
							exactSum += zs[s];
						} else {
							const w = 1 / d2;
							sw += w;
							swz += w * zs[s];
						}
					}
				} else {
					for (let s = 0; s < n; s++) {
						const ex = xs[s] - cx;
						const ey = ys[s] - cy;
						const d2 = ex * ex + ey * ey;
						if (d2 === 0) {
							exact++;
							exactSum += zs[s];
						} else {
							const w = weight(d2);
							sw += w;
							swz += w * zs[s];
						}
					}
				}
				out[j * nx + i] = exact > 0 ? exactSum / exact : swz / sw;
			}
		}
		return out;
	}

	const index = new NeighbourIndex(xs, ys);
	const maxD = radius ?? Infinity;
	const kk = k ?? n;
	const idx = new Int32Array(Math.min(kk, n));
	const d2s = new Float64Array(Math.min(kk, n));
	for (let j = 0; j < ny; j++) {
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
				if (d2 === 0) {
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
	return out;
}

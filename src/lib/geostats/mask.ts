import { NeighbourIndex } from './neighbours';
import type { GridSpec, Sample } from './types';
import { requirePositive } from '../foundation/validate';
import { validateGrid, validateSamples } from './validate';
import { InputError } from '../foundation/errors';

/**
 * Returns a copy of `values` in which every cell whose centre is farther than maxDistanceM
 * (metres) from every sample is NaN. Use it to hide estimates far from data, where a
 * kriged grid only reverts to the mean.
 */
export function maskByDistance(
	values: Float64Array,
	grid: GridSpec,
	samples: Sample[],
	maxDistanceM: number,
	opts?: { maxCells?: number }
): Float64Array {
	validateGrid(grid, opts?.maxCells);
	validateSamples(samples, 0);
	const limit = requirePositive('maxDistanceM', maxDistanceM);
	if (values.length !== grid.nx * grid.ny) {
		throw new InputError('values', values.length, `must have nx × ny = ${grid.nx * grid.ny} cells`);
	}
	const out = values.slice();
	const index = new NeighbourIndex(
		Float64Array.from(samples, (s) => s.x),
		Float64Array.from(samples, (s) => s.y)
	);
	const idx = new Int32Array(1);
	const d2 = new Float64Array(1);
	const { nx, ny, x0, y0, dx, dy } = grid;
	for (let j = 0; j < ny; j++) {
		const cy = y0 + (j + 0.5) * dy;
		for (let i = 0; i < nx; i++) {
			const found = index.nearest(x0 + (i + 0.5) * dx, cy, 1, limit, idx, d2);
			if (found === 0) out[j * nx + i] = NaN;
		}
	}
	return out;
}

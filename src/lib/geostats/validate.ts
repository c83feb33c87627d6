// Checks of the geostatistics inputs (samples, grid, variogram); the generic number checks are
// the shared ones in foundation/validate.ts.
import { InputError } from '../foundation/errors';
import {
	requireFinite,
	requireNonNegative,
	requirePositive,
	requirePositiveInteger
} from '../foundation/validate';
import { MAX_GRID_CELLS } from './grid';
import type { GridSpec, Sample, Variogram } from './types';

const MODELS = new Set(['spherical', 'exponential', 'gaussian']);

/** Checks every sample has finite x, y (m), value and, when given, a finite sigma ≥ 0. */
export function validateSamples(samples: unknown, minCount: number, field = 'samples'): Sample[] {
	if (!Array.isArray(samples)) throw new InputError(field, samples, 'must be an array');
	if (samples.length < minCount) {
		throw new InputError(
			field,
			samples,
			`needs at least ${minCount} sample${minCount === 1 ? '' : 's'}`
		);
	}
	for (let k = 0; k < samples.length; k++) {
		const s = samples[k] as Partial<Sample> | null;
		if (s === null || typeof s !== 'object') {
			throw new InputError(`${field}[${k}]`, s, 'must be an object');
		}
		requireFinite(`${field}[${k}].x`, s.x);
		requireFinite(`${field}[${k}].y`, s.y);
		requireFinite(`${field}[${k}].value`, s.value);
		if (s.sigma !== undefined) requireNonNegative(`${field}[${k}].sigma`, s.sigma);
	}
	return samples as Sample[];
}

/** Checks a grid spec: finite origin, positive cell size, positive integer counts, cell limit. */
export function validateGrid(
	grid: unknown,
	maxCells: number = MAX_GRID_CELLS,
	field = 'grid'
): GridSpec {
	if (grid === null || typeof grid !== 'object') {
		throw new InputError(field, grid, 'must be a GridSpec object');
	}
	const g = grid as Partial<GridSpec>;
	requireFinite(`${field}.x0`, g.x0);
	requireFinite(`${field}.y0`, g.y0);
	requirePositive(`${field}.dx`, g.dx);
	requirePositive(`${field}.dy`, g.dy);
	const nx = requirePositiveInteger(`${field}.nx`, g.nx);
	const ny = requirePositiveInteger(`${field}.ny`, g.ny);
	const limit = requirePositiveInteger('opts.maxCells', maxCells);
	if (nx * ny > limit) {
		throw new InputError(
			`${field}.nx × ${field}.ny`,
			nx * ny,
			`exceeds the cell limit of ${limit} (raise opts.maxCells if intended)`
		);
	}
	return g as GridSpec;
}

/** Checks a variogram: known model, nugget ≥ 0, partial sill > 0, range > 0 (all finite). */
export function validateVariogram(v: unknown, field = 'v'): Variogram {
	if (v === null || typeof v !== 'object') {
		throw new InputError(field, v, 'must be a Variogram object');
	}
	const vg = v as Partial<Variogram>;
	if (typeof vg.model !== 'string' || !MODELS.has(vg.model)) {
		throw new InputError(
			`${field}.model`,
			vg.model,
			"must be 'spherical', 'exponential' or 'gaussian'"
		);
	}
	requireNonNegative(`${field}.nugget`, vg.nugget);
	requirePositive(`${field}.partialSill`, vg.partialSill);
	requirePositive(`${field}.rangeM`, vg.rangeM);
	return vg as Variogram;
}

/** Checks an optional neighbour count (integer ≥ 1) and returns it or undefined. */
export function optionalNeighbours(field: string, value: unknown): number | undefined {
	if (value === undefined) return undefined;
	return requirePositiveInteger(field, value);
}

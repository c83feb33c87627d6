import { GeostatsInputError } from './errors';
import { MAX_GRID_CELLS } from './grid';
import type { GridSpec, Sample, Variogram } from './types';

const MODELS = new Set(['spherical', 'exponential', 'gaussian']);

/** Throws unless value is a finite number. */
export function requireFinite(field: string, value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new GeostatsInputError(field, value, 'must be a finite number');
	}
	return value;
}

/** Throws unless value is a finite number > 0. */
export function requirePositive(field: string, value: unknown): number {
	const v = requireFinite(field, value);
	if (!(v > 0)) throw new GeostatsInputError(field, value, 'must be greater than zero');
	return v;
}

/** Throws unless value is an integer ≥ 1. */
export function requirePositiveInteger(field: string, value: unknown): number {
	const v = requirePositive(field, value);
	if (!Number.isInteger(v)) throw new GeostatsInputError(field, value, 'must be an integer');
	return v;
}

/** Checks every sample has finite x, y (m), value and, when given, a finite sigma ≥ 0. */
export function validateSamples(samples: unknown, minCount: number, field = 'samples'): Sample[] {
	if (!Array.isArray(samples)) throw new GeostatsInputError(field, samples, 'must be an array');
	if (samples.length < minCount) {
		throw new GeostatsInputError(
			field,
			samples,
			`needs at least ${minCount} sample${minCount === 1 ? '' : 's'}`
		);
	}
	for (let k = 0; k < samples.length; k++) {
		const s = samples[k] as Partial<Sample> | null;
		if (s === null || typeof s !== 'object') {
			throw new GeostatsInputError(`${field}[${k}]`, s, 'must be an object');
		}
		requireFinite(`${field}[${k}].x`, s.x);
		requireFinite(`${field}[${k}].y`, s.y);
		requireFinite(`${field}[${k}].value`, s.value);
		if (s.sigma !== undefined) {
			const sg = requireFinite(`${field}[${k}].sigma`, s.sigma);
			if (sg < 0) throw new GeostatsInputError(`${field}[${k}].sigma`, sg, 'must be ≥ 0');
		}
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
		throw new GeostatsInputError(field, grid, 'must be a GridSpec object');
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
		throw new GeostatsInputError(
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
		throw new GeostatsInputError(field, v, 'must be a Variogram object');
	}
	const vg = v as Partial<Variogram>;
	if (typeof vg.model !== 'string' || !MODELS.has(vg.model)) {
		throw new GeostatsInputError(
			`${field}.model`,
			vg.model,
			"must be 'spherical', 'exponential' or 'gaussian'"
		);
	}
	const nugget = requireFinite(`${field}.nugget`, vg.nugget);
	if (nugget < 0) throw new GeostatsInputError(`${field}.nugget`, nugget, 'must be ≥ 0');
	requirePositive(`${field}.partialSill`, vg.partialSill);
	requirePositive(`${field}.rangeM`, vg.rangeM);
	return vg as Variogram;
}

/** Checks an optional neighbour count (integer ≥ 1) and returns it or undefined. */
export function optionalNeighbours(field: string, value: unknown): number | undefined {
	if (value === undefined) return undefined;
	return requirePositiveInteger(field, value);
}

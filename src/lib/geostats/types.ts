/** A measurement at a point in projected metres; `sigma` is its 1-σ error in the value's unit. */
export interface Sample {
	x: number;
	y: number;
	value: number;
	sigma?: number;
}

/**
 * A regular grid in projected metres. Cell (i, j) has its centre at
 * (x0 + (i + 0.5) dx, y0 + (j + 0.5) dy); arrays are row-major with j outer
 * (index = j * nx + i), so row 0 is the row at the smallest y (south when dy > 0).
 */
export interface GridSpec {
	x0: number;
	y0: number;
	dx: number;
	dy: number;
	nx: number;
	ny: number;
}

export type VariogramModel = 'spherical' | 'exponential' | 'gaussian';

/**
 * A bounded variogram with nugget. `rangeM` is the range for spherical and the practical
 * range (γ reaches ~95 % of the sill) for exponential and gaussian.
 */
export interface Variogram {
	model: VariogramModel;
	nugget: number;
	partialSill: number;
	rangeM: number;
}

/** One lag class of an empirical variogram: mean pair distance (m), semivariance, pair count. */
export interface VariogramPoint {
	hM: number;
	gamma: number;
	pairs: number;
}

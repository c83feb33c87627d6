import { contours } from 'd3-contour';
import type { Feature, FeatureCollection, MultiPolygon, Position } from 'geojson';
import { InputError } from '../foundation/errors';
import type { GridSpec } from './types';
import { requireFinite } from '../foundation/validate';
import { validateGrid } from './validate';

/** Properties of one contour band: the area where the grid value ≥ `value`. */
export interface ContourProperties {
	value: number;
}

export type ContourCollection = FeatureCollection<MultiPolygon, ContourProperties>;

/**
 * Filled contours (marching squares, via d3-contour) of a row-major grid, as GeoJSON
 * MultiPolygons in GRID coordinates: cell (i, j)'s centre is at (i + 0.5, j + 0.5), so the
 * grid spans [0, nx] × [0, ny] (d3-contour's convention matches ours). Each feature is the
 * area where value ≥ threshold. NaN cells count as below every threshold, so bands stop at
 * the centres of the last valid cells next to them. Use contoursToProjected for metres.
 */
export function contourGrid(
	values: ArrayLike<number>,
	grid: GridSpec,
	thresholds: number[],
	opts?: { smooth?: boolean; maxCells?: number }
): ContourCollection {
	validateGrid(grid, opts?.maxCells);
	if (values.length !== grid.nx * grid.ny) {
		throw new InputError('values', values.length, `must have nx × ny = ${grid.nx * grid.ny} cells`);
	}
	if (!Array.isArray(thresholds)) {
		throw new InputError('thresholds', thresholds, 'must be an array of numbers');
	}
	thresholds.forEach((t, k) => requireFinite(`thresholds[${k}]`, t));
	const generator = contours()
		.size([grid.nx, grid.ny])
		.smooth(opts?.smooth ?? true)
		.thresholds(thresholds);
	// d3-contour only indexes values[k], so a typed array works as well as number[].
	const polygons = generator(values as unknown as number[]);
	return {
		type: 'FeatureCollection',
		features: polygons.map((p): Feature<MultiPolygon, ContourProperties> => ({
			type: 'Feature',
			properties: { value: p.value },
			geometry: { type: 'MultiPolygon', coordinates: p.coordinates }
		}))
	};
}

/** Maps a grid-coordinate position (gx, gy) to projected metres: x0 + gx·dx, y0 + gy·dy. */
export function gridToProjected(grid: GridSpec, position: Position): Position {
	return [grid.x0 + position[0] * grid.dx, grid.y0 + position[1] * grid.dy];
}

/**
 * Maps contours from grid coordinates to projected metres (cell centre (i + 0.5, j + 0.5)
 * → (x0 + (i + 0.5) dx, y0 + (j + 0.5) dy)). Rings are reversed so exterior rings run
 * counter-clockwise and holes clockwise, as RFC 7946 §3.1.6 recommends (d3-contour emits
 * the opposite orientation).
 */
export function contoursToProjected(fc: ContourCollection, grid: GridSpec): ContourCollection {
	validateGrid(grid, Number.MAX_SAFE_INTEGER);
	return {
		type: 'FeatureCollection',
		features: fc.features.map((f) => ({
			type: 'Feature',
			properties: { ...f.properties },
			geometry: {
				type: 'MultiPolygon',
				coordinates: f.geometry.coordinates.map((poly) =>
					poly.map((ring) => ring.map((p) => gridToProjected(grid, p)).reverse())
				)
			}
		}))
	};
}

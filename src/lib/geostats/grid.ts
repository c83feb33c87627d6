import type { GridSpec } from './types';

/**
 * Default upper limit on nx × ny (2048²). A grid this size is 32 MiB per Float64Array;
 * the limit stops a mistyped cell size from exhausting memory. Override with `opts.maxCells`.
 */
export const MAX_GRID_CELLS = 4_194_304;

/** x of the centre of column i, in metres. */
export function cellCentreX(grid: GridSpec, i: number): number {
	return grid.x0 + (i + 0.5) * grid.dx;
}

/** y of the centre of row j, in metres. */
export function cellCentreY(grid: GridSpec, j: number): number {
	return grid.y0 + (j + 0.5) * grid.dy;
}

/** Row-major index of cell (i, j): j outer, i inner. */
export function cellIndex(grid: GridSpec, i: number, j: number): number {
	return j * grid.nx + i;
}

/** A grid of nx × ny cells whose extent edges are [xMin, xMax] × [yMin, yMax] in metres. */
export function gridFromExtent(
	xMin: number,
	yMin: number,
	xMax: number,
	yMax: number,
	nx: number,
	ny: number
): GridSpec {
	return { x0: xMin, y0: yMin, dx: (xMax - xMin) / nx, dy: (yMax - yMin) / ny, nx, ny };
}

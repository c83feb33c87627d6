import type { GridPlan } from './plan';
import { projectedRegion } from './region-stats';

/**
 * Cells of a grid outside its drawn region: a cell belongs to the region when its centre lies
 * inside the region's projected polygon (the pixel-centre rule of raster clipping, common
 * practice, no source), so the overlays and every download leave the same cells empty.
 * Own code (science of the grid's geometry, a few lines): even–odd ray casting per cell row.
 */
export function outsideRegion(plan: GridPlan, polygon: number[][]): Uint8Array {
	const ring = projectedRegion(plan, { polygon });
	const { x0, y0, dx, dy, nx, ny } = plan.grid;
	const outside = new Uint8Array(nx * ny).fill(1);
	const xs: number[] = [];
	for (let j = 0; j < ny; j++) {
		const y = y0 + (j + 0.5) * dy;
		// Where the row's centre line crosses the ring's edges, sorted: inside between pairs.
		xs.length = 0;
		for (let k = 0, n = ring.length; k < n; k++) {
			const [ax, ay] = ring[k];
			const [bx, by] = ring[(k + 1) % n];
			if (ay > y !== by > y) xs.push(ax + ((y - ay) / (by - ay)) * (bx - ax));
		}
		xs.sort((a, b) => a - b);
		for (let p = 0; p + 1 < xs.length; p += 2) {
			const i0 = Math.max(0, Math.ceil((xs[p] - x0) / dx - 0.5));
			const i1 = Math.min(nx - 1, Math.floor((xs[p + 1] - x0) / dx - 0.5));
			for (let i = i0; i <= i1; i++) outside[j * nx + i] = 0;
		}
	}
	return outside;
}

/** Copies of the cells with those outside the region set to NaN (the grids' nodata). */
export function clipCells(cells: Float32Array, outside: Uint8Array | null): Float32Array {
	if (!outside) return cells;
	const out = Float32Array.from(cells);
	for (let c = 0; c < out.length; c++) if (outside[c]) out[c] = NaN;
	return out;
}

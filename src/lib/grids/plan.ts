import type { GridSpec } from '../geostats';
import { chooseCrs, projector, type ComputationCrs } from './projection';
import { MAX_REQUEST_CELLS, type GridRequest } from './request';

export interface GridPlan {
	crs: ComputationCrs;
	grid: GridSpec;
}

/** Points along each bbox edge: a projected lon/lat box has curved edges, so corners are not enough. */
const EDGE_POINTS = 16;

/**
 * The grid of a request: the projected extent of its lon/lat box (edges densified), snapped
 * outward to whole cells, in the region's computation CRS. A sentence when the region cannot be
 * gridded or would have more than MAX_REQUEST_CELLS cells.
 */
export function planGrid(
	req: Pick<GridRequest, 'bbox' | 'cellSizeM'>
): { ok: true; plan: GridPlan } | { ok: false; error: string } {
	const [w, s, e, n] = req.bbox as [number, number, number, number];
	const chosen = chooseCrs([w, s, e, n]);
	if (!chosen.ok) return chosen;
	const { forward } = projector(chosen.crs);
	let xMin = Infinity,
		yMin = Infinity,
		xMax = -Infinity,
		yMax = -Infinity;
	for (let k = 0; k <= EDGE_POINTS; k++) {
		const t = k / EDGE_POINTS;
		const lon = w + t * (e - w);
		const lat = s + t * (n - s);
		for (const [x, y] of [forward(lon, s), forward(lon, n), forward(w, lat), forward(e, lat)]) {
			xMin = Math.min(xMin, x);
			xMax = Math.max(xMax, x);
			yMin = Math.min(yMin, y);
			yMax = Math.max(yMax, y);
		}
	}
	const c = req.cellSizeM;
	const x0 = Math.floor(xMin / c) * c;
	const y0 = Math.floor(yMin / c) * c;
	const nx = Math.max(1, Math.ceil((xMax - x0) / c));
	const ny = Math.max(1, Math.ceil((yMax - y0) / c));
	if (nx * ny > MAX_REQUEST_CELLS)
		return {
			ok: false,
			error: `a cell size of ${c} m makes ${nx} × ${ny} = ${(nx * ny).toLocaleString('en')} cells; at most ${MAX_REQUEST_CELLS.toLocaleString('en')} are allowed, so choose larger cells or a smaller region`
		};
	return { ok: true, plan: { crs: chosen.crs, grid: { x0, y0, dx: c, dy: c, nx, ny } } };
}

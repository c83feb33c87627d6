import { cellSizeM } from '$lib/map/grid';
import type { CellParts } from '../repositories/map-cells';
import {
	mercatorY,
	MERCATOR_M_PER_DEGREE,
	selectInBox,
	type Box,
	type SiteBlock,
	type SiteTest
} from './block';

/** Largest grid of cells summed in flat arrays; a larger one (a huge box at a fine zoom) uses a Map. */
const MAX_DENSE_CELLS = 1 << 20;

/**
 * Cell sums of the matching sites of some blocks in a box at a zoom: the same cells, counts, sums,
 * minima and maxima the SQL of repositories/map.ts (liveParts) groups, with the same cell
 * formulas, so memory and SQL parts add up with combineParts. The cells of a box form a small
 * grid (a view holds a few hundred), summed in flat typed arrays rather than a Map per site.
 */
export function blockCellParts(
	blocks: readonly SiteBlock[],
	box: Box,
	zoom: number,
	test: SiteTest
): CellParts[] {
	const size = cellSizeM(zoom);
	const ix0 = Math.floor((box.west * MERCATOR_M_PER_DEGREE) / size);
	const ix1 = Math.floor((box.east * MERCATOR_M_PER_DEGREE) / size);
	const iy0 = Math.floor(mercatorY(box.south) / size);
	const iy1 = Math.floor(mercatorY(box.north) / size);
	const nx = ix1 - ix0 + 1;
	const ny = iy1 - iy0 + 1;
	const dense = nx * ny <= MAX_DENSE_CELLS;
	const cells = dense ? nx * ny : 0;
	const count = new Int32Array(cells);
	const withValue = new Int32Array(cells);
	const sum = new Float64Array(cells);
	const min = new Float64Array(cells).fill(Infinity);
	const max = new Float64Array(cells).fill(-Infinity);
	// Outside the grid (never for sites inside the box, but cheap to be sure) or a huge grid.
	const sparse = new Map<number, CellParts>();
	for (const b of blocks) {
		const [selected, n] = selectInBox(b, box, test);
		const { lon, mercY, heatFlow } = b;
		for (let k = 0; k < n; k++) {
			const i = selected[k];
			const ix = Math.floor((lon[i] * MERCATOR_M_PER_DEGREE) / size);
			const iy = Math.floor(mercY[i] / size);
			const v = heatFlow[i];
			if (dense && ix >= ix0 && ix <= ix1 && iy >= iy0 && iy <= iy1) {
				const c = (ix - ix0) * ny + (iy - iy0);
				count[c]++;
				if (v === v) {
					withValue[c]++;
					sum[c] += v;
					if (v < min[c]) min[c] = v;
					if (v > max[c]) max[c] = v;
				}
				continue;
			}
			// |ix|, |iy| < 2^25 up to zoom 22, so ix·2^26 + iy is exact and unique.
			const key = ix * 67108864 + iy;
			let p = sparse.get(key);
			if (!p) {
				p = { ix, iy, count: 0, withValue: 0, sumMWm2: null, minMWm2: null, maxMWm2: null };
				sparse.set(key, p);
			}
			p.count++;
			if (v === v) {
				p.withValue++;
				p.sumMWm2 = (p.sumMWm2 ?? 0) + v;
				p.minMWm2 = p.minMWm2 === null || v < p.minMWm2 ? v : p.minMWm2;
				p.maxMWm2 = p.maxMWm2 === null || v > p.maxMWm2 ? v : p.maxMWm2;
			}
		}
	}
	const parts = [...sparse.values()];
	for (let c = 0; c < cells; c++) {
		if (count[c] === 0) continue;
		const has = withValue[c] > 0;
		parts.push({
			ix: ix0 + Math.floor(c / ny),
			iy: iy0 + (c % ny),
			count: count[c],
			withValue: withValue[c],
			sumMWm2: has ? sum[c] : null,
			minMWm2: has ? min[c] : null,
			maxMWm2: has ? max[c] : null
		});
	}
	return parts;
}

/** How many matching sites of some blocks lie in a box (the whole world when none is given). */
export function blockCount(blocks: readonly SiteBlock[], test: SiteTest, box?: Box): number {
	const all = box ?? { west: -180, south: -90, east: 180, north: 90 };
	let n = 0;
	for (const b of blocks) n += selectInBox(b, all, test)[1];
	return n;
}

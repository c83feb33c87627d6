import { cellSizeM } from '$lib/map/grid';
import type { CellParts } from '../repositories/map-cells';
import {
	forEachInBox,
	MERCATOR_M_PER_DEGREE,
	type Box,
	type SiteBlock,
	type SiteTest
} from './block';

/**
 * Cell sums of the matching sites of some blocks in a box at a zoom: the same cells, counts, sums,
 * minima and maxima the SQL of repositories/map.ts (liveParts) groups, with the same cell
 * formulas, so memory and SQL parts add up with combineParts.
 */
export function blockCellParts(
	blocks: readonly SiteBlock[],
	box: Box,
	zoom: number,
	test: SiteTest
): CellParts[] {
	const size = cellSizeM(zoom);
	// A number key per cell: |ix|, |iy| < 2^25 up to zoom 22, so ix·2^26 + iy is exact and unique.
	const byCell = new Map<number, CellParts>();
	for (const b of blocks) {
		forEachInBox(b, box, test, (i) => {
			const ix = Math.floor((b.lon[i] * MERCATOR_M_PER_DEGREE) / size);
			const iy = Math.floor(b.mercY[i] / size);
			const key = ix * 67108864 + iy;
			let c = byCell.get(key);
			if (!c) {
				c = { ix, iy, count: 0, withValue: 0, sumMWm2: null, minMWm2: null, maxMWm2: null };
				byCell.set(key, c);
			}
			c.count++;
			const v = b.heatFlow[i];
			if (v === v) {
				c.withValue++;
				c.sumMWm2 = (c.sumMWm2 ?? 0) + v;
				c.minMWm2 = c.minMWm2 === null || v < c.minMWm2 ? v : c.minMWm2;
				c.maxMWm2 = c.maxMWm2 === null || v > c.maxMWm2 ? v : c.maxMWm2;
			}
		});
	}
	return [...byCell.values()];
}

/** How many matching sites of some blocks lie in a box (the whole world when none is given). */
export function blockCount(blocks: readonly SiteBlock[], test: SiteTest, box?: Box): number {
	const all = box ?? { west: -180, south: -90, east: 180, north: 90 };
	let n = 0;
	for (const b of blocks) forEachInBox(b, all, test, () => n++);
	return n;
}

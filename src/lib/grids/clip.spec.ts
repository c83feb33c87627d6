import { describe, expect, it } from 'vitest';
import { clipCells, outsideRegion } from './clip';
import type { GridPlan } from './plan';
import { chooseCrs, projector } from './projection';

// A 10 × 10 grid of 10 km cells in UTM 32N and a concave (L-shaped) region whose corners sit a
// quarter cell off the cell edges, so every cell centre is ≥ 2.5 km from the region's edges and
// the expected cells can be counted by hand: columns 1–5 of rows 1–2, columns 1–2 of rows 3–6.
describe('clipping a grid to its drawn region', () => {
	const chosen = chooseCrs([7, 58, 9, 59]);
	if (!chosen.ok) throw new Error(chosen.error);
	const { forward, inverse } = projector(chosen.crs);
	const [cx, cy] = forward(8, 58.5);
	const grid = { x0: cx - 50_000, y0: cy - 50_000, dx: 10_000, dy: 10_000, nx: 10, ny: 10 };
	const plan: GridPlan = { crs: chosen.crs, grid };
	const cellUnits = [
		[1.25, 1.25],
		[6.25, 1.25],
		[6.25, 3.25],
		[3.25, 3.25],
		[3.25, 7.25],
		[1.25, 7.25]
	];
	const polygon = cellUnits.map(([u, v]) => inverse(grid.x0 + u * grid.dx, grid.y0 + v * grid.dy));

	it('keeps exactly the cells whose centre is inside, also in the concave corner', () => {
		const outside = outsideRegion(plan, polygon);
		const inside: string[] = [];
		outside.forEach((o, c) => {
			if (!o) inside.push(`${c % 10},${Math.floor(c / 10)}`);
		});
		const expected: string[] = [];
		for (let j = 0; j < 10; j++)
			for (let i = 0; i < 10; i++)
				if ((j >= 1 && j <= 2 && i >= 1 && i <= 5) || (j >= 3 && j <= 6 && i >= 1 && i <= 2))
					expected.push(`${i},${j}`);
		expect(inside).toEqual(expected);
		expect(inside).toHaveLength(18);
	});

	it('sets cells outside to NaN in a copy, and leaves cells alone without a region', () => {
		const cells = new Float32Array(100).fill(70);
		const clipped = clipCells(cells, outsideRegion(plan, polygon));
		expect(clipped.filter((v) => !Number.isNaN(v))).toHaveLength(18);
		expect(Number.isNaN(clipped[0])).toBe(true);
		expect(clipped[11]).toBe(70);
		expect(cells[0]).toBe(70);
		expect(clipCells(cells, null)).toBe(cells);
	});
});

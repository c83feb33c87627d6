import { describe, expect, it } from 'vitest';
import { contourGrid, contoursToProjected, gridToProjected } from './contours';
import type { GridSpec } from './types';

/** Signed area by the shoelace formula: positive when counter-clockwise (x right, y up). */
function signedArea(ring: number[][]): number {
	let a = 0;
	for (let k = 0; k < ring.length - 1; k++)
		a += ring[k][0] * ring[k + 1][1] - ring[k + 1][0] * ring[k][1];
	return a / 2;
}

describe('contourGrid (d3-contour) and contoursToProjected', () => {
	// 5 × 5 grid with a single peak of 10 at the centre cell (2, 2), zero elsewhere.
	const grid: GridSpec = { x0: 1000, y0: 2000, dx: 10, dy: 20, nx: 5, ny: 5 };
	const peak = new Float64Array(25);
	peak[2 * 5 + 2] = 10;

	it('puts the contour between cell centres in grid coordinates (centre of (i, j) at i + 0.5)', () => {
		const fc = contourGrid(peak, grid, [5]);
		expect(fc.features).toHaveLength(1);
		expect(fc.features[0].properties.value).toBe(5);
		const ring = fc.features[0].geometry.coordinates[0][0];
		const xs = ring.map((p) => p[0]);
		const ys = ring.map((p) => p[1]);
		// Level 5 is halfway between the peak centre (2.5) and its neighbours' centres (1.5, 3.5).
		expect(Math.min(...xs)).toBeCloseTo(2, 12);
		expect(Math.max(...xs)).toBeCloseTo(3, 12);
		expect(Math.min(...ys)).toBeCloseTo(2, 12);
		expect(Math.max(...ys)).toBeCloseTo(3, 12);
	});

	it('maps to projected metres with the cell-centre convention and CCW exterior rings', () => {
		expect(gridToProjected(grid, [2.5, 2.5])).toEqual([1025, 2050]); // centre of cell (2, 2)
		const fc = contoursToProjected(contourGrid(peak, grid, [5]), grid);
		const ring = fc.features[0].geometry.coordinates[0][0];
		const xs = ring.map((p) => p[0]);
		const ys = ring.map((p) => p[1]);
		expect(Math.min(...xs)).toBeCloseTo(1020, 9);
		expect(Math.max(...xs)).toBeCloseTo(1030, 9);
		expect(Math.min(...ys)).toBeCloseTo(2040, 9);
		expect(Math.max(...ys)).toBeCloseTo(2060, 9);
		expect(signedArea(ring)).toBeGreaterThan(0); // RFC 7946 §3.1.6 recommendation
	});

	it('treats NaN cells as below every threshold', () => {
		const values = new Float64Array(25).fill(10);
		for (let j = 0; j < 5; j++) values[j * 5 + 4] = NaN; // last column unknown
		const fc = contourGrid(values, grid, [5]);
		const xs = fc.features[0].geometry.coordinates.flat(2).map((p) => p[0]);
		expect(Math.max(...xs)).toBeCloseTo(3.5, 12); // stops at the centres of column 3
		expect(Math.min(...xs)).toBe(0); // the grid edge on the valid side
	});

	it('gives an empty band above the maximum and rejects bad thresholds', () => {
		expect(contourGrid(peak, grid, [11]).features[0].geometry.coordinates).toEqual([]);
		expect(() => contourGrid(peak, grid, [NaN])).toThrow(
			expect.objectContaining({ field: 'thresholds[0]' })
		);
		expect(() => contourGrid(new Float64Array(3), grid, [1])).toThrow(
			expect.objectContaining({ field: 'values' })
		);
	});
});

import { describe, expect, it } from 'vitest';
import { isothermDepthGrid } from './at-depth';
import { CRUST_MODELS } from './crust-models';
import type { GridPlan } from './plan';
import { chooseCrs, projector } from './projection';
import {
	cellWeights,
	gridRegionStatistics,
	regionStatisticsRequestSchema,
	weightedSummary
} from './region-stats';

/*
 * Hand-computed on a 3 × 2 grid of 10 m cells (x0 = y0 = 0), south row first:
 *   north row  90  100  NaN (masked)
 *   south row  60   70   80
 * Region: the rectangle x 5…30, y 0…15. Areas inside each cell (m²):
 *   north row  25   50   50
 *   south row  50  100  100
 * Covered area (NaN left out) = 50 + 100 + 100 + 25 + 50 = 325 m².
 * Mean = (50·60 + 100·70 + 100·80 + 25·90 + 50·100) / 325 = 25 250 / 325 = 77.6923…
 * Sorted with cumulative area 60:50, 70:150, 80:250, 90:275, 100:325 → with the inverse of the
 * weighted distribution (Hyndman & Fan 1996, definition 1): P10 (≥ 32.5) = 60, P50 (≥ 162.5) = 80,
 * P90 (≥ 292.5) = 100.
 */
const grid = { x0: 0, y0: 0, dx: 10, dy: 10, nx: 3, ny: 2 };
const value = Float32Array.from([60, 70, 80, 90, 100, NaN]);
const rect: [number, number][] = [
	[5, 0],
	[30, 0],
	[30, 15],
	[5, 15]
];

describe('area-weighted region statistics of a grid', () => {
	it('weights each cell by the area of the region inside it', () => {
		const w = cellWeights(grid, rect);
		expect(Object.fromEntries(w.map((c) => [c.index, c.areaM2]))).toEqual({
			0: 50,
			1: 100,
			2: 100,
			3: 25,
			4: 50,
			5: 50
		});
	});

	it('gives the hand-computed mean and P10/P50/P90, leaving out the masked cell', () => {
		const s = weightedSummary(value, cellWeights(grid, rect));
		expect(s.coveredAreaM2).toBe(325);
		expect(s.mean).toBeCloseTo(25250 / 325, 10);
		expect([s.p10, s.p50, s.p90]).toEqual([60, 80, 100]);
	});

	it('clips a concave polygon exactly (an L shape over four cells)', () => {
		// L: the 20 × 20 square minus its north-east 10 × 10 cell → 300 m² over cells 0, 1, 3.
		const l: [number, number][] = [
			[0, 0],
			[20, 0],
			[20, 10],
			[10, 10],
			[10, 20],
			[0, 20]
		];
		const w = cellWeights({ x0: 0, y0: 0, dx: 10, dy: 10, nx: 2, ny: 2 }, l);
		expect(w.map((c) => [c.index, c.areaM2])).toEqual([
			[0, 100],
			[1, 100],
			[2, 100]
		]);
	});

	it('is empty when every covered cell is masked', () => {
		const s = weightedSummary(Float32Array.from([NaN, NaN]), [
			{ index: 0, areaM2: 1 },
			{ index: 1, areaM2: 1 }
		]);
		expect(s).toEqual({ coveredAreaM2: 0, mean: null, p10: null, p50: null, p90: null });
	});

	it('a lon/lat rectangle over a real grid: heat flow and isotherm depth follow the cells', () => {
		const chosen = chooseCrs([7, 58, 9, 59]);
		if (!chosen.ok) throw new Error(chosen.error);
		const { forward } = projector(chosen.crs);
		const [cx, cy] = forward(8, 58.5);
		// 3 × 2 cells of 10 km round the centre, with the values above.
		const plan: GridPlan = {
			crs: chosen.crs,
			grid: { x0: cx - 15_000, y0: cy - 10_000, dx: 10_000, dy: 10_000, nx: 3, ny: 2 }
		};
		// A rectangle well beyond the grid: every cell counts in full (6 × 10⁸ m², 5 with a value).
		const s = gridRegionStatistics(plan, value, null, { bbox: [7, 58, 9, 59] });
		expect(s.regionAreaM2).toBeCloseTo(6e8, 0);
		expect(s.heatFlowMWm2.coveredAreaM2).toBeCloseTo(5e8, 0);
		expect(s.heatFlowMWm2.mean).toBeCloseTo((60 + 70 + 80 + 90 + 100) / 5, 4);
		expect([s.heatFlowMWm2.p10, s.heatFlowMWm2.p50, s.heatFlowMWm2.p90]).toEqual([60, 80, 100]);
		// Five equal areas (cumulative 0.2, 0.4, …): P10 = 1st, P50 = 3rd, P90 = 5th value.
		// Depth falls as heat flow rises, so the depth percentiles are the depths of 100, 80, 60.
		const d = isothermDepthGrid(Float32Array.from([100, 80, 60]), null, 150).p50;
		expect(s.isothermDepthM.temperatureC).toBe(150);
		expect(s.isothermDepthM.p10).toBe(d[0]);
		expect(s.isothermDepthM.p50).toBe(d[1]);
		expect(s.isothermDepthM.p90).toBe(d[2]);
		expect(s.isothermDepthM.notReachedAreaM2).toBe(0);
		expect(s.isothermDepthM.p10!).toBeLessThan(s.isothermDepthM.p90!);
	});

	it('reads the isotherm depth in the chosen crustal model', () => {
		const chosen = chooseCrs([7, 58, 9, 59]);
		if (!chosen.ok) throw new Error(chosen.error);
		const [cx, cy] = projector(chosen.crs).forward(8, 58.5);
		const plan: GridPlan = {
			crs: chosen.crs,
			grid: { x0: cx - 15_000, y0: cy - 10_000, dx: 10_000, dy: 10_000, nx: 3, ny: 2 }
		};
		const at = (crust?: 'basin' | 'continental') =>
			gridRegionStatistics(plan, value, null, { bbox: [7, 58, 9, 59], crust }).isothermDepthM;
		expect(at()).toEqual(at('continental'));
		expect(at().crust).toBe('continental');
		// Sediment conducts less: 150 °C lies shallower under the same heat flow (cell by cell).
		const basin = at('basin');
		expect(basin.crust).toBe('basin');
		expect(basin.p50!).toBeLessThan(at().p50!);
		expect(basin.p50).toBe(
			isothermDepthGrid(Float32Array.from([80]), null, 150, CRUST_MODELS.basin).p50[0]
		);
	});

	it('refuses a region that is neither one bbox nor one polygon', () => {
		expect(regionStatisticsRequestSchema.safeParse({}).success).toBe(false);
		expect(
			regionStatisticsRequestSchema.safeParse({
				bbox: [1, 2, 3, 4],
				polygon: [
					[0, 0],
					[1, 0],
					[1, 1]
				]
			}).success
		).toBe(false);
		expect(regionStatisticsRequestSchema.safeParse({ bbox: [3, 2, 1, 4] }).success).toBe(false);
		expect(regionStatisticsRequestSchema.safeParse({ bbox: [1, 2, 3, 4] }).success).toBe(true);
	});
});

import { describe, expect, it } from 'vitest';
import { computeGrid } from './compute';
import { planGrid } from './plan';
import { chooseCrs, projector, utmZone } from './projection';
import { gridRequestSchema, requestProblem } from './request';

const base = { method: 'kriging', bbox: [7, 58, 9, 59.5], cellSizeM: 5000 };

describe('grid request schema', () => {
	it('accepts a minimal request and reads filters as the map does', () => {
		const r = gridRequestSchema.parse({
			...base,
			filters: { minHeatFlow: 50, quality: ['constrained'] }
		});
		expect(r.power).toBe(2);
		expect(r.filters.minHeatFlow).toBe(50);
		expect(r.filters.quality).toEqual(['constrained']);
	});
	it.each([
		[{ ...base, bbox: [170, 0, -170, 10] }, /antimeridian/],
		[{ ...base, bbox: [NaN, 0, 1, 1] }, /bbox/],
		[{ ...base, bbox: [0, 0, 1] }, /bbox/],
		[{ ...base, method: 'spline' }, /method/],
		[{ ...base, cellSizeM: -1 }, /cellSizeM/],
		[
			{ ...base, variogram: { model: 'spherical', nuggetMWm2: 50, sillMWm2: 40, rangeM: 1e4 } },
			/sill/
		]
	])('refuses %j with a sentence', (body, pattern) => {
		const parsed = gridRequestSchema.safeParse(body);
		expect(parsed.success).toBe(false);
		expect(requestProblem(parsed.error!)).toMatch(pattern);
	});
});

describe('computation CRS', () => {
	it('is the UTM zone of the centre, north or south (EPSG 326zz / 327zz)', () => {
		// Zone 32 spans 6°E–12°E (common practice, no source).
		expect(utmZone(9)).toBe(32);
		const north = chooseCrs([7, 58, 9, 59.5]);
		expect(north.ok && north.crs.epsg).toBe(32632);
		const south = chooseCrs([-71, -34, -69, -32]);
		expect(south.ok && south.crs.epsg).toBe(32719);
	});
	it('refuses regions too wide or polar', () => {
		expect(chooseCrs([0, 0, 30, 10]).ok).toBe(false);
		expect(chooseCrs([0, 80, 10, 86]).ok).toBe(false);
	});
	it('round-trips lon/lat through the projection', () => {
		const c = chooseCrs([7, 58, 9, 59.5]);
		if (!c.ok) throw new Error(c.error);
		const p = projector(c.crs);
		const [x, y] = p.forward(8, 59);
		expect(x).toBeCloseTo(500000 - 57_400, -3); // 1° west of the central meridian at 59° N ≈ 57 km
		const [lon, lat] = p.inverse(x, y);
		expect(lon).toBeCloseTo(8, 8);
		expect(lat).toBeCloseTo(59, 8);
	});
});

describe('planGrid', () => {
	it('snaps the projected extent to whole cells', () => {
		const p = planGrid({ bbox: [7, 58, 9, 59.5], cellSizeM: 5000 });
		if (!p.ok) throw new Error(p.error);
		expect(p.plan.grid.x0 % 5000).toBe(0);
		expect(p.plan.grid.nx).toBeGreaterThan(20);
		expect(p.plan.grid.ny).toBeGreaterThan(30);
	});
	it('refuses more than 4 million cells with a sentence', () => {
		const p = planGrid({ bbox: [7, 58, 9, 59.5], cellSizeM: 50 });
		expect(p.ok).toBe(false);
		expect(!p.ok && p.error).toMatch(/cells/);
	});
});

describe('computeGrid', () => {
	const samples = [
		{ x: 0, y: 0, value: 60, sigma: 3 },
		{ x: 10000, y: 0, value: 70, sigma: 3 },
		{ x: 0, y: 10000, value: 65, sigma: 3 },
		{ x: 10000, y: 10000, value: 80, sigma: 3 },
		{ x: 5000, y: 5000, value: 72, sigma: 3 },
		{ x: 2000, y: 8000, value: 66, sigma: 3 }
	];
	const grid = { x0: -5000, y0: -5000, dx: 1000, dy: 1000, nx: 20, ny: 20 };
	it('kriges with σ, lowers a fitted nugget by the mean site σ², reports progress', async () => {
		const req = gridRequestSchema.parse({ ...base });
		const seen: number[] = [];
		const out = await computeGrid(samples, grid, req, async (f) => void seen.push(f));
		expect(out.sigma).not.toBeNull();
		expect(seen.at(-1)).toBe(1);
		expect(out.variogram!.meanMeasurementVarianceMWm2).toBeCloseTo(9, 10);
		expect(out.crossValidation.pairs).toHaveLength(6);
		expect(Number.isFinite(out.crossValidation.meanStandardisedError!)).toBe(true);
		for (const v of out.value) expect(v).toBeGreaterThan(50);
	});
	it('IDW is exact at a cell centre holding a site and masks far cells', async () => {
		const req = gridRequestSchema.parse({ ...base, method: 'idw', maskDistanceM: 3000 });
		const g = { x0: -500, y0: -500, dx: 1000, dy: 1000, nx: 20, ny: 20 };
		const out = await computeGrid(samples, g, req);
		expect(out.sigma).toBeNull();
		expect(out.value[0]).toBeCloseTo(60, 4); // cell (0,0) centre is site (0,0)
		expect(Number.isNaN(out.value[19 * 20 + 19])).toBe(true); // (19 km, 19 km) is > 3 km from every site
		expect(out.maskedCells).toBeGreaterThan(0);
	});
	it('IDW cross-validation: each site from all the others, or from its nearest k (hand-computed)', async () => {
		// Three sites on a line at 0, 1 and 3 km with 10, 20, 40 mW/m², power 2 (Shepard 1968).
		const line = [
			{ x: 0, y: 0, value: 10 },
			{ x: 1000, y: 0, value: 20 },
			{ x: 3000, y: 0, value: 40 }
		];
		const g = { x0: 0, y0: 0, dx: 1000, dy: 1000, nx: 1, ny: 1 };
		const all = await computeGrid(line, g, gridRequestSchema.parse({ ...base, method: 'idw' }));
		const idw = (pts: [number, number][]) =>
			pts.reduce((s, [d, v]) => s + v / d ** 2, 0) / pts.reduce((s, [d]) => s + 1 / d ** 2, 0);
		expect(all.crossValidation.pairs.map(([, p]) => p)).toEqual([
			expect.closeTo(
				idw([
					[1000, 20],
					[3000, 40]
				]),
				10
			),
			expect.closeTo(
				idw([
					[1000, 10],
					[2000, 40]
				]),
				10
			),
			expect.closeTo(
				idw([
					[3000, 10],
					[2000, 20]
				]),
				10
			)
		]);
		const one = await computeGrid(
			line,
			g,
			gridRequestSchema.parse({ ...base, method: 'idw', maxNeighbours: 1 })
		);
		expect(one.crossValidation.pairs.map(([, p]) => p)).toEqual([20, 10, 20]);
	});
	it('IDW cross-validation: a site within √1e-13 m of another takes its value (GDAL invdist hit rule)', async () => {
		const near = [
			{ x: 0, y: 0, value: 10 },
			{ x: 1000, y: 1e-7, value: 20 },
			{ x: 1000, y: 0, value: 30 },
			{ x: 3000, y: 0, value: 40 },
			// 1 m away: weighed as 1/d² against the hit, it would move the estimate by ~1e-13.
			{ x: 1001, y: 0, value: 50 }
		];
		const g = { x0: 0, y0: 0, dx: 1000, dy: 1000, nx: 1, ny: 1 };
		const out = await computeGrid(near, g, gridRequestSchema.parse({ ...base, method: 'idw' }));
		const predicted = out.crossValidation.pairs.map(([, p]) => p);
		expect(predicted[1]).toBe(30);
		expect(predicted[2]).toBe(20);
		expect(predicted[0]).toBeGreaterThan(10);
		expect(predicted[0]).toBeLessThan(40);
	});
	it('uses a user variogram as given', async () => {
		const req = gridRequestSchema.parse({
			...base,
			variogram: { model: 'exponential', nuggetMWm2: 2, sillMWm2: 50, rangeM: 20000 }
		});
		const out = await computeGrid(samples, grid, req);
		expect(out.variogram).toMatchObject({
			model: 'exponential',
			nugget: 2,
			partialSill: 48,
			source: 'user'
		});
	});
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../foundation/errors';
import { inverseDistanceGrid } from './idw';
import { loadFixture } from './fixtures/load';
import type { GridSpec, Sample } from './types';

interface GdalFixture {
	source: string;
	grid: GridSpec;
	nodata: number;
	points: [number, number, number][];
	cases: { name: string; algorithm: string; xyz: [number, number, number][] }[];
}

const gdal = loadFixture<GdalFixture>('gdal-idw.json');
const gdalSamples: Sample[] = gdal.points.map(([x, y, value]) => ({ x, y, value }));

/**
 * gdal_grid was run with -txe 0 6000 -tye 0 4000 -outsize 12 10: those are the grid's EXTENT
 * edges, so its cell centres are ours. It writes a north-up raster, so XYZ row r (from the
 * top) is our row j = ny − 1 − r; column order is the same.
 */
function gdalToOurOrder(xyz: [number, number, number][], g: GridSpec, nodata: number) {
	const out = new Float64Array(g.nx * g.ny);
	xyz.forEach(([x, y, z], k) => {
		const r = Math.floor(k / g.nx);
		const i = k % g.nx;
		const j = g.ny - 1 - r;
		expect(x).toBeCloseTo(g.x0 + (i + 0.5) * g.dx, 6);
		expect(y).toBeCloseTo(g.y0 + (j + 0.5) * g.dy, 6);
		out[j * g.nx + i] = z === nodata ? NaN : z;
	});
	return out;
}

function expectGridsClose(ours: Float64Array, ref: Float64Array, relTol: number) {
	expect(ours.length).toBe(ref.length);
	for (let k = 0; k < ref.length; k++) {
		if (Number.isNaN(ref[k])) expect(ours[k]).toBeNaN();
		else expect(Math.abs(ours[k] - ref[k])).toBeLessThanOrEqual(relTol * Math.abs(ref[k]));
	}
}

describe('inverseDistanceGrid against GDAL gdal_grid (fixtures/gdal-idw.sh)', () => {
	// gdal_grid's printed values look single-precision (~1e-7 relative), hence 1e-6. The
	// fixture turns off GDAL's float32 SIMD path for invdist power 2 (see gdal-idw.sh).
	const byName = new Map(gdal.cases.map((c) => [c.name, c]));
	const ref = (name: string) => gdalToOurOrder(byName.get(name)!.xyz, gdal.grid, gdal.nodata);

	it('matches invdist power 2 with every sample', () => {
		expectGridsClose(
			inverseDistanceGrid(gdalSamples, gdal.grid, { power: 2 }),
			ref('all_p2'),
			1e-6
		);
	});
	it('matches invdist power 3 with every sample', () => {
		expectGridsClose(
			inverseDistanceGrid(gdalSamples, gdal.grid, { power: 3 }),
			ref('all_p3'),
			1e-6
		);
	});
	it('matches invdistnn with max_points=8 (nearest 8)', () => {
		const ours = inverseDistanceGrid(gdalSamples, gdal.grid, { power: 2, maxNeighbours: 8 });
		expectGridsClose(ours, ref('nn8_p2'), 1e-6);
	});
	it('matches invdistnn radius=300 max_points=6, NaN where GDAL wrote nodata', () => {
		const ours = inverseDistanceGrid(gdalSamples, gdal.grid, {
			power: 2,
			maxNeighbours: 6,
			radiusM: 300
		});
		const r = ref('nn6_r300_p2');
		expect(r.some(Number.isNaN)).toBe(true);
		expectGridsClose(ours, r, 1e-6);
	});
});

describe('inverseDistanceGrid, hand-computed (Shepard 1968: w = 1/d^p)', () => {
	const samples: Sample[] = [
		{ x: 0, y: 0, value: 10 },
		{ x: 300, y: 0, value: 40 }
	];
	const grid: GridSpec = { x0: 0, y0: -50, dx: 100, dy: 100, nx: 3, ny: 1 };
	// Cell centres (50, 0), (150, 0), (250, 0).

	it('weights by 1/d² between two samples', () => {
		const g = inverseDistanceGrid(samples, grid, { power: 2 });
		// (50, 0): d = 50 and 250 → w = 1/2500, 1/62500 → (10·25 + 40·1) / 26 = 290/26.
		expect(g[0]).toBeCloseTo(290 / 26, 12);
		expect(g[1]).toBeCloseTo(25, 12); // equidistant: plain mean
		expect(g[2]).toBeCloseTo((10 + 40 * 25) / 26, 12);
	});

	it('power 1 weights by 1/d', () => {
		const g = inverseDistanceGrid(samples, grid, { power: 1 });
		// (50, 0): w = 1/50, 1/250 → (10·5 + 40) / 6 = 15.
		expect(g[0]).toBeCloseTo(15, 12);
	});

	it('uses only the nearest sample with maxNeighbours 1', () => {
		const g = inverseDistanceGrid(samples, grid, { power: 2, maxNeighbours: 1 });
		expect(Array.from(g)).toEqual([10, 10, 40]); // the middle cell ties; either is nearest
	});

	it('a cell with no sample within radiusM is NaN', () => {
		const g = inverseDistanceGrid(samples, grid, { power: 2, radiusM: 60 });
		expect(g[0]).toBe(10);
		expect(g[1]).toBeNaN();
		expect(g[2]).toBe(40);
	});

	it('radiusM alone uses every sample within it', () => {
		const g = inverseDistanceGrid(samples, grid, { power: 2, radiusM: 260 });
		expect(g[0]).toBeCloseTo(290 / 26, 12);
	});

	it('row-major order with j outer and the row at y0 first', () => {
		const s: Sample[] = [
			{ x: 5, y: 5, value: 1 },
			{ x: 5, y: 15, value: 2 }
		];
		const g = inverseDistanceGrid(
			s,
			{ x0: 0, y0: 0, dx: 10, dy: 10, nx: 2, ny: 2 },
			{
				power: 2,
				maxNeighbours: 1
			}
		);
		expect(Array.from(g)).toEqual([1, 1, 2, 2]);
	});
});

describe('inverseDistanceGrid properties (Shepard 1968)', () => {
	it('is exact at a sample location (cell centre on a sample)', () => {
		const samples: Sample[] = [
			{ x: 150, y: 250, value: 71.5 },
			{ x: 900, y: 40, value: 55 },
			{ x: 420, y: 777, value: 90 }
		];
		const grid: GridSpec = { x0: 100, y0: 200, dx: 100, dy: 100, nx: 5, ny: 5 };
		for (const opts of [{ power: 2 }, { power: 2, maxNeighbours: 2 }, { power: 3, radiusM: 1e4 }]) {
			expect(inverseDistanceGrid(samples, grid, opts)[0]).toBe(71.5);
		}
	});

	it('stays within [min, max] of the samples (common practice, no source: convex weights)', () => {
		const sample = fc.record({
			x: fc.double({ min: -1e4, max: 1e4, noNaN: true }),
			y: fc.double({ min: -1e4, max: 1e4, noNaN: true }),
			value: fc.double({ min: -1e3, max: 1e3, noNaN: true })
		});
		fc.assert(
			fc.property(
				fc.array(sample, { minLength: 1, maxLength: 30 }),
				fc.double({ min: 0.5, max: 4, noNaN: true }),
				fc.option(fc.integer({ min: 1, max: 10 }), { nil: undefined }),
				(samples, power, maxNeighbours) => {
					const grid: GridSpec = { x0: -1e4, y0: -1e4, dx: 2500, dy: 2500, nx: 8, ny: 8 };
					const g = inverseDistanceGrid(samples, grid, { power, maxNeighbours });
					const lo = Math.min(...samples.map((s) => s.value));
					const hi = Math.max(...samples.map((s) => s.value));
					const tol = 1e-9 * Math.max(1, Math.abs(lo), Math.abs(hi));
					for (const v of g) {
						expect(v).toBeGreaterThanOrEqual(lo - tol);
						expect(v).toBeLessThanOrEqual(hi + tol);
					}
				}
			),
			{ numRuns: 100 }
		);
	});
});

describe('inverseDistanceGrid input errors', () => {
	const ok: Sample[] = [{ x: 0, y: 0, value: 1 }];
	const grid: GridSpec = { x0: 0, y0: 0, dx: 1, dy: 1, nx: 2, ny: 2 };
	const cases: [string, () => unknown, string, unknown][] = [
		[
			'NaN x',
			() => inverseDistanceGrid([{ x: NaN, y: 0, value: 1 }], grid, { power: 2 }),
			'samples[0].x',
			NaN
		],
		[
			'Infinity value',
			() => inverseDistanceGrid([...ok, { x: 1, y: 1, value: Infinity }], grid, { power: 2 }),
			'samples[1].value',
			Infinity
		],
		[
			'-Infinity y',
			() => inverseDistanceGrid([{ x: 0, y: -Infinity, value: 1 }], grid, { power: 2 }),
			'samples[0].y',
			-Infinity
		],
		['zero dx', () => inverseDistanceGrid(ok, { ...grid, dx: 0 }, { power: 2 }), 'grid.dx', 0],
		[
			'negative dy',
			() => inverseDistanceGrid(ok, { ...grid, dy: -5 }, { power: 2 }),
			'grid.dy',
			-5
		],
		[
			'fractional nx',
			() => inverseDistanceGrid(ok, { ...grid, nx: 2.5 }, { power: 2 }),
			'grid.nx',
			2.5
		],
		['zero power', () => inverseDistanceGrid(ok, grid, { power: 0 }), 'opts.power', 0],
		[
			'NaN radius',
			() => inverseDistanceGrid(ok, grid, { power: 2, radiusM: NaN }),
			'opts.radiusM',
			NaN
		],
		[
			'zero neighbours',
			() => inverseDistanceGrid(ok, grid, { power: 2, maxNeighbours: 0 }),
			'opts.maxNeighbours',
			0
		],
		['no samples', () => inverseDistanceGrid([], grid, { power: 2 }), 'samples', []],
		[
			'too many cells',
			() => inverseDistanceGrid(ok, { ...grid, nx: 3000, ny: 3000 }, { power: 2 }),
			'grid.nx × grid.ny',
			9e6
		]
	];
	it.each(cases)('%s throws InputError naming the field', (_, call, field, value) => {
		expect(call).toThrow(InputError);
		try {
			call();
		} catch (e) {
			expect(e).toBeInstanceOf(RangeError);
			expect((e as InputError).field).toBe(field);
			expect((e as InputError).value).toEqual(value);
			expect((e as Error).message).toContain(field);
		}
	});

	it('the cell limit is overridable through opts.maxCells', () => {
		expect(() =>
			inverseDistanceGrid(ok, { ...grid, nx: 10, ny: 10 }, { power: 2, maxCells: 99 })
		).toThrow(/exceeds the cell limit of 99/);
		expect(
			inverseDistanceGrid(ok, { ...grid, nx: 10, ny: 10 }, { power: 2, maxCells: 100 })
		).toHaveLength(100);
	});
});

describe('inverseDistanceGrid, every sample at power 2 (the four-cell kernel)', () => {
	// 7 × 3 cells: one block of four and a tail of three per row, so both code paths run.
	const grid: GridSpec = { x0: 0, y0: 0, dx: 10, dy: 10, nx: 7, ny: 3 };
	const samples: Sample[] = [
		{ x: 15, y: 5, value: 0 }, // on cell (1, 0)'s centre, value 0 (1/0 · 0 would be NaN)
		{ x: 35, y: 15 + 1e-7, value: 30 }, // within √1e-13 m of cell (3, 1): a hit, as in GDAL
		{ x: 62, y: 21, value: 80 },
		{ x: 41, y: 2, value: 55 },
		{ x: 3, y: 28, value: 12 }
	];

	it('gives the same cells as the neighbour path with every sample, hits included', () => {
		const fast = inverseDistanceGrid(samples, grid, { power: 2 });
		const slow = inverseDistanceGrid(samples, grid, { power: 2, maxNeighbours: samples.length });
		expect(fast[0 * 7 + 1]).toBe(0);
		expect(fast[1 * 7 + 3]).toBe(30);
		for (let c = 0; c < fast.length; c++) {
			expect(Number.isFinite(fast[c])).toBe(true);
			expect(Math.abs(fast[c] - slow[c])).toBeLessThanOrEqual(1e-12 * Math.abs(slow[c]) + 1e-12);
		}
	});

	it('matches the hand-computed weighted mean away from samples', () => {
		const g = inverseDistanceGrid(samples, grid, { power: 2 });
		// Cell (5, 2), centre (55, 25).
		let sw = 0;
		let swz = 0;
		for (const s of samples) {
			const w = 1 / ((s.x - 55) ** 2 + (s.y - 25) ** 2);
			sw += w;
			swz += w * s.value;
		}
		expect(g[2 * 7 + 5]).toBeCloseTo(swz / sw, 12);
	});
});

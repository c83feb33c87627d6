import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../foundation/errors';
import { SingularSystemError } from './errors';
import { krigePoint, krigingRows, ordinaryKrigingGrid } from './kriging';
import { loadFixture } from './fixtures/load';
import { createRandom } from '../foundation/random';
import type { GridSpec, Sample, Variogram } from './types';

interface GstatCase {
	variogram: Variogram;
	maxNeighbours: number | null;
	points: { x: number; y: number; pred: number; var: number }[];
}
interface GstatFixture {
	samples: Sample[];
	grid: GridSpec;
	kriging: GstatCase[];
	measurement: { sigma: number; variogram: Variogram; points: GstatCase['points'] };
}
const gstat = loadFixture<GstatFixture>('gstat.json');
const nCells = gstat.grid.nx * gstat.grid.ny;

const sph: Variogram = { model: 'spherical', nugget: 0, partialSill: 50, rangeM: 3000 };
const few: Sample[] = [
	{ x: 0, y: 0, value: 60 },
	{ x: 1000, y: 200, value: 72 },
	{ x: 400, y: 1300, value: 55 },
	{ x: 1500, y: 1500, value: 80 },
	{ x: 2200, y: 300, value: 66 }
];

describe('ordinaryKrigingGrid against R gstat krige() (fixtures/gstat-reference.R)', () => {
	// Mapping: our rangeM is the practical range a. gstat's "Exp" range is a/3 and its "Gau"
	// range a/√3 (gstat uses the scale parameter); "Sph" range is a. gstat's var1.var is the
	// kriging variance; our sigma is its square root. The R script applies the mapping.
	it.each(
		gstat.kriging.map((c) => [c.variogram.model, c.variogram.nugget, c.maxNeighbours, c] as const)
	)('%s nugget %s nmax %s: estimate and variance agree to 1e-9', (_m, _n, _k, c) => {
		const opts = c.maxNeighbours === null ? undefined : { maxNeighbours: c.maxNeighbours };
		const { value, sigma } = ordinaryKrigingGrid(gstat.samples, gstat.grid, c.variogram, opts);
		for (let k = 0; k < nCells; k++) {
			expect(value[k]).toBeCloseTo(c.points[k].pred, 9);
			expect(sigma[k] ** 2).toBeCloseTo(c.points[k].var, 9);
		}
		// The extra rows are the first three sample locations (exactness).
		for (const p of c.points.slice(nCells)) {
			const r = krigePoint(gstat.samples, c.variogram, p.x, p.y, opts);
			expect(r.value).toBeCloseTo(p.pred, 9);
			expect(r.sigma ** 2).toBeCloseTo(p.var, 9);
		}
	});

	it('measurement error σ matches gstat with a vgm(σ², "Err") component', () => {
		// gstat's "Err" is nugget-like variance that is not part of the predicted field: the
		// same as our σᵢ² on the data-covariance diagonal when every sample has sigma σ.
		const m = gstat.measurement;
		const noisy = gstat.samples.map((s) => ({ ...s, sigma: m.sigma }));
		const { value, sigma } = ordinaryKrigingGrid(noisy, gstat.grid, m.variogram);
		for (let k = 0; k < nCells; k++) {
			expect(value[k]).toBeCloseTo(m.points[k].pred, 9);
			expect(sigma[k] ** 2).toBeCloseTo(m.points[k].var, 9);
		}
		for (const p of m.points.slice(nCells)) {
			const r = krigePoint(noisy, m.variogram, p.x, p.y);
			expect(r.value).toBeCloseTo(p.pred, 9);
			expect(r.sigma ** 2).toBeCloseTo(p.var, 9);
		}
	});
});

describe('kriging properties (Cressie 1993, §3.2)', () => {
	it('weights sum to one (unbiasedness constraint), for any layout', () => {
		const pt = fc.record({
			x: fc.double({ min: 0, max: 5000, noNaN: true }),
			y: fc.double({ min: 0, max: 5000, noNaN: true }),
			value: fc.double({ min: 0, max: 200, noNaN: true })
		});
		fc.assert(
			fc.property(
				fc.uniqueArray(pt, {
					minLength: 3,
					maxLength: 25,
					selector: (s) => `${Math.round(s.x / 50)}|${Math.round(s.y / 50)}`
				}),
				fc.constantFrom<Variogram['model']>('spherical', 'exponential', 'gaussian'),
				fc.double({ min: 0.1, max: 5, noNaN: true }),
				fc.double({ min: 0, max: 5000, noNaN: true }),
				fc.option(fc.integer({ min: 3, max: 10 }), { nil: undefined }),
				(samples, model, nugget, x, maxNeighbours) => {
					const v: Variogram = { model, nugget, partialSill: 10, rangeM: 2500 };
					const r = krigePoint(samples, v, x, 2500, { maxNeighbours });
					const sum = r.weights.reduce((a, b) => a + b, 0);
					expect(sum).toBeCloseTo(1, 8);
					expect(r.sigma).toBeGreaterThanOrEqual(0);
				}
			),
			{ numRuns: 150 }
		);
	});

	it('is exact at samples with zero nugget and no sigma, with σ = 0 there', () => {
		for (const model of ['spherical', 'exponential', 'gaussian'] as const) {
			const v: Variogram = { model, nugget: 0, partialSill: 50, rangeM: 3000 };
			for (const s of few) {
				for (const maxNeighbours of [undefined, 3]) {
					const r = krigePoint(few, v, s.x, s.y, { maxNeighbours });
					expect(r.value).toBeCloseTo(s.value, 8);
					expect(r.sigma).toBeLessThan(1e-5);
				}
			}
		}
	});

	it('σ grows with distance from the data', () => {
		const at = (d: number) => krigePoint(few, sph, 2200 + d, 300).sigma;
		const s = [0, 100, 300, 800, 2000].map(at);
		for (let k = 1; k < s.length; k++) expect(s[k]).toBeGreaterThan(s[k - 1]);
		expect(s[4]).toBeLessThanOrEqual(Math.sqrt(50 * 2)); // bounded: at most √(2·sill) for OK
	});

	it('a sample with a large sigma pulls the surface less (filtered kriging)', () => {
		// Sample 3 (value 80) is the high outlier; give it growing measurement errors.
		const target = { x: 1400, y: 1400 };
		const pull = (sigma?: number) => {
			const s = few.map((p, k) => (k === 3 ? { ...p, sigma } : p));
			const r = krigePoint(s, sph, target.x, target.y);
			return { value: r.value, weight: r.weights[3] };
		};
		const exact = pull(undefined);
		const small = pull(2);
		const large = pull(20);
		expect(small.weight).toBeLessThan(exact.weight);
		expect(large.weight).toBeLessThan(small.weight);
		expect(large.value).toBeLessThan(small.value);
		expect(small.value).toBeLessThan(exact.value);
		// And it is no longer honoured at its own location.
		const own = krigePoint(
			few.map((p, k) => (k === 3 ? { ...p, sigma: 5 } : p)),
			sph,
			1500,
			1500
		);
		expect(Math.abs(own.value - 80)).toBeGreaterThan(0.1);
	});

	it('uses the nearest maxNeighbours samples', () => {
		const r = krigePoint(few, sph, 0, 10, { maxNeighbours: 3 });
		expect(r.indices).toEqual([0, 1, 2]);
	});

	it('the grid path gives the same numbers as point kriging at cell centres', () => {
		const grid: GridSpec = { x0: -500, y0: -500, dx: 700, dy: 600, nx: 5, ny: 4 };
		for (const maxNeighbours of [undefined, 4]) {
			const g = ordinaryKrigingGrid(few, grid, sph, { maxNeighbours });
			const r = krigePoint(few, sph, -500 + 2.5 * 700, -500 + 1.5 * 600, { maxNeighbours });
			expect(g.value[1 * 5 + 2]).toBeCloseTo(r.value, 12);
			expect(g.sigma[1 * 5 + 2]).toBeCloseTo(r.sigma, 12);
		}
	});
});

describe('kriging input errors and singular systems', () => {
	const grid: GridSpec = { x0: 0, y0: 0, dx: 100, dy: 100, nx: 3, ny: 3 };
	const fieldOf = (call: () => unknown) => {
		try {
			call();
		} catch (e) {
			expect(e).toBeInstanceOf(InputError);
			return (e as InputError).field;
		}
		return 'did not throw';
	};

	it('needs at least 3 samples', () => {
		expect(fieldOf(() => ordinaryKrigingGrid(few.slice(0, 2), grid, sph))).toBe('samples');
	});

	it.each([
		['NaN x', { x: NaN }, 'samples[1].x'],
		['Infinity y', { y: Infinity }, 'samples[1].y'],
		['-Infinity value', { value: -Infinity }, 'samples[1].value'],
		['NaN sigma', { sigma: NaN }, 'samples[1].sigma'],
		['negative sigma', { sigma: -1 }, 'samples[1].sigma']
	])('%s names %s', (_, patch, field) => {
		const bad = few.map((s, k) => (k === 1 ? { ...s, ...patch } : s));
		expect(fieldOf(() => ordinaryKrigingGrid(bad, grid, sph))).toBe(field);
	});

	it.each([
		['zero range', { rangeM: 0 }, 'v.rangeM'],
		['negative partial sill', { partialSill: -3 }, 'v.partialSill'],
		['NaN nugget', { nugget: NaN }, 'v.nugget']
	])('variogram %s names %s', (_, patch, field) => {
		expect(fieldOf(() => ordinaryKrigingGrid(few, grid, { ...sph, ...patch }))).toBe(field);
	});

	it('rejects a bad grid, neighbour count and cell limit', () => {
		expect(fieldOf(() => ordinaryKrigingGrid(few, { ...grid, dx: 0 }, sph))).toBe('grid.dx');
		expect(fieldOf(() => ordinaryKrigingGrid(few, grid, sph, { maxNeighbours: 2.5 }))).toBe(
			'opts.maxNeighbours'
		);
		expect(fieldOf(() => ordinaryKrigingGrid(few, grid, sph, { maxCells: 8 }))).toBe(
			'grid.nx × grid.ny'
		);
	});

	it('names a duplicate location without sigma, and accepts it with a sigma', () => {
		const dup = [...few, { x: 1000, y: 200, value: 70 }];
		expect(fieldOf(() => ordinaryKrigingGrid(dup, grid, sph))).toBe('samples[5]');
		const withSigma = [...few, { x: 1000, y: 200, value: 70, sigma: 1 }];
		expect(ordinaryKrigingGrid(withSigma, grid, sph).value.every(Number.isFinite)).toBe(true);
	});

	it('reports a numerically singular system (near-duplicates, gaussian, no nugget)', () => {
		const near = [...few, { x: 1000 + 1e-9, y: 200, value: 70 }];
		const gau: Variogram = { model: 'gaussian', nugget: 0, partialSill: 50, rangeM: 3000 };
		expect(() => ordinaryKrigingGrid(near, grid, gau)).toThrow(SingularSystemError);
		expect(() => ordinaryKrigingGrid(near, grid, gau, { maxNeighbours: 4 })).toThrow(
			SingularSystemError
		);
	});
});

describe('krigingRows: any split of the rows gives the same grid', () => {
	it('strips in any order equal one pass, bit for bit (neighbour sets and factors reused)', () => {
		const rnd = createRandom(12).uniform;
		const samples: Sample[] = Array.from({ length: 300 }, () => ({
			x: rnd() * 10_000,
			y: rnd() * 10_000,
			value: 60 + 20 * rnd(),
			sigma: rnd() < 0.5 ? 1 + 3 * rnd() : undefined
		}));
		const g: GridSpec = { x0: 0, y0: 0, dx: 250, dy: 250, nx: 40, ny: 40 };
		for (const v of [
			{ model: 'gaussian', nugget: 0, partialSill: 50, rangeM: 4000 },
			{ model: 'spherical', nugget: 2, partialSill: 40, rangeM: 3000 }
		] as Variogram[]) {
			const whole = ordinaryKrigingGrid(samples, g, v, { maxNeighbours: 12 });
			const value = new Float64Array(g.nx * g.ny);
			const sigma = new Float64Array(g.nx * g.ny);
			const rows = krigingRows(samples, g, v, { maxNeighbours: 12 });
			for (const [j0, j1] of [
				[30, 40],
				[0, 7],
				[20, 30],
				[7, 20]
			])
				rows(j0, j1, value, sigma);
			expect(value).toEqual(whole.value);
			expect(sigma).toEqual(whole.sigma);
		}
	});
});

describe('singular systems in small value units', () => {
	it('reports near-duplicates 1 mm apart when the sill is far below 1, as the LU solver alone did', () => {
		// Values in W/m² rather than mW/m²: sill 5e-5. The bordered matrix LU sees holds 1s.
		const tiny: Variogram = { model: 'gaussian', nugget: 0, partialSill: 5e-5, rangeM: 3000 };
		const near = [
			...few.map((s) => ({ ...s, value: s.value / 1000 })),
			{ x: 1000 + 1e-3, y: 200, value: 0.07 }
		];
		const g: GridSpec = { x0: 0, y0: 0, dx: 500, dy: 500, nx: 4, ny: 4 };
		expect(() => ordinaryKrigingGrid(near, g, tiny, { maxNeighbours: 4 })).toThrow(
			SingularSystemError
		);
	});
});

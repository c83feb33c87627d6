import { runInNewContext } from 'node:vm';
import { describe, expect, it } from 'vitest';
import { HIT_D2, idwEverySitePower2Rows, idwRows } from '$lib/geostats/idw';
import { createRandom } from '$lib/foundation/random';
import { computeGrid } from '$lib/grids/compute';
import { gridRequestSchema } from '$lib/grids/request';
import { GridThreadError, gridThreadCount, idwThreads } from './idw-threads';

// Invented sites; one sits exactly on a cell centre (a hit, the kernel's careful path) and the
// grid's width is not a multiple of four (the tail cells) nor its height of the strip height.
const rnd = createRandom(12).uniform;
const grid = { x0: 0, y0: 0, dx: 1000, dy: 1000, nx: 23, ny: 37 };
const samples = [
	...Array.from({ length: 300 }, () => ({
		x: rnd() * 23000,
		y: rnd() * 37000,
		value: 40 + 60 * rnd()
	})),
	{ x: 5500, y: 7500, value: 99 }
];
const inputs = idwRows(samples, grid, { power: 2 }).everySitePower2!;

function oneThread(): Float64Array {
	const out = new Float64Array(grid.nx * grid.ny);
	idwEverySitePower2Rows(inputs.xs, inputs.ys, inputs.zs, grid.nx, 0, 0, 1000, 1000, 0, 37, out);
	return out;
}

describe('IDW on worker threads', () => {
	it('gives the one-thread grid bit for bit, with progress in order up to every row', async () => {
		const want = oneThread();
		expect(want[7 * grid.nx + 5]).toBe(99);
		const got = new Float64Array(grid.nx * grid.ny);
		const rows: number[] = [];
		await idwThreads(2)!(inputs, grid, 4, got, async (r) => void rows.push(r));
		expect(Buffer.from(got.buffer).equals(Buffer.from(want.buffer))).toBe(true);
		expect(rows).toEqual([...rows].sort((a, b) => a - b));
		expect(rows).toHaveLength(Math.ceil(37 / 4));
		expect(rows.at(-1)).toBe(37);
	});

	it('computeGrid with threads equals computeGrid without, bit for bit', async () => {
		const req = gridRequestSchema.parse({
			method: 'idw',
			bbox: [7, 58, 9, 59],
			cellSizeM: 1000,
			power: 2
		});
		const plain = await computeGrid(samples, grid, req);
		const threaded = await computeGrid(samples, grid, req, async () => {}, {
			idwStrips: idwThreads(2)
		});
		expect(Buffer.from(threaded.value.buffer).equals(Buffer.from(plain.value.buffer))).toBe(true);
	});

	it('the kernel is self-contained: it runs from its text in an empty context', () => {
		const run = (fn: (...a: never[]) => unknown) => {
			const out = new Float64Array(grid.nx * grid.ny);
			const f = runInNewContext(`(${fn.toString()})`, {});
			f(inputs.xs, inputs.ys, inputs.zs, grid.nx, 0, 0, 1000, 1000, 0, 37, out);
			return out;
		};
		expect(run(idwEverySitePower2Rows)).toEqual(oneThread());
		// The check can fail: a kernel reaching for an outer binding does not run there.
		const leaky = () => HIT_D2;
		expect(() => run(leaky)).toThrow(/is not defined/);
	});

	it('the kernel writes HIT_D2 and 1 / HIT_D2 as literals of the same values', () => {
		const text = idwEverySitePower2Rows.toString();
		expect(HIT_D2).toBe(1e-13);
		expect(text).toContain('d2 < 1e-13');
		// Four in the JavaScript pass, one where the SIMD pass's Σw are read.
		expect(text.match(/< 1 \/ 1e-13/g)).toHaveLength(5);
	});

	it('a failing thread rejects with a clear error', async () => {
		const broken = () => {
			throw new Error('kernel broke');
		};
		const run = idwThreads(2, broken)!(inputs, grid, 4, new Float64Array(23 * 37), async () => {});
		await expect(run).rejects.toThrow(GridThreadError);
		await expect(run).rejects.toThrow(/a grid thread failed: kernel broke/);
	});

	it('a failing progress report stops the run with that error', async () => {
		const stop = new Error('superseded');
		const run = idwThreads(2)!(inputs, grid, 4, new Float64Array(23 * 37), async (r) => {
			if (r > 8) throw stop;
		});
		await expect(run).rejects.toBe(stop);
	});

	it('an abort ends the run with its reason', async () => {
		const stop = new AbortController();
		const reason = new Error('stop');
		const run = idwThreads(2)!(
			inputs,
			grid,
			4,
			new Float64Array(23 * 37),
			async () => stop.abort(reason),
			stop.signal
		);
		await expect(run).rejects.toBe(reason);
	});

	it('computeGrid: a failing progress report during the threaded run is the error it throws', async () => {
		const req = gridRequestSchema.parse({
			method: 'idw',
			bbox: [7, 58, 9, 59],
			cellSizeM: 1000,
			power: 2
		});
		const stop = new Error('superseded');
		for (const at of [0.15, 0.5]) {
			const run = computeGrid(
				samples,
				grid,
				req,
				async (f) => {
					if (f >= at) throw stop;
				},
				{ idwStrips: idwThreads(2) }
			);
			await expect(run).rejects.toBe(stop);
		}
	});

	it('thread count: THERMALITH_GRID_THREADS, else at most two; 1 means no threads', () => {
		expect(gridThreadCount({ THERMALITH_GRID_THREADS: '3' })).toBe(3);
		expect(gridThreadCount({})).toBeGreaterThanOrEqual(1);
		expect(gridThreadCount({})).toBeLessThanOrEqual(2);
		expect(() => gridThreadCount({ THERMALITH_GRID_THREADS: '0' })).toThrow();
		expect(idwThreads(1)).toBeUndefined();
	});
});

import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { idwEverySitePower2Rows } from '$lib/geostats/idw';
import { IDW_SIMD_WASM } from '$lib/geostats/idw-simd-module';
import type { IdwStripRunner } from '$lib/grids/compute';
import { gridThreadsSchema } from '../env-schema.js';

/**
 * IDW with every site on worker threads: the grid's row strips are shared out to a few threads
 * that run the same kernel (idwEverySitePower2Rows) into one shared result array. Each cell
 * depends only on the samples, so the grid is bit-identical to one thread (tested).
 *
 * Why threads made from source text (`new Worker(source, { eval: true })`) rather than a worker
 * file or a pool package (piscina): the code runs three ways — bundled by the SvelteKit build
 * into build/server/chunks, under vitest, and under tsx (scripts/grid-worker.ts, benchmarks) —
 * and a separate worker entry file would have to exist, compiled, in each of them. The kernel
 * is one self-contained function (no outer references; a test runs it in an empty context), so
 * its own text, in whichever form the code runs, is the whole worker.
 */

/** A thread that failed or stopped: the same inputs would fail again, so the grid fails. */
export class GridThreadError extends Error {}

/**
 * A thread takes the next strip from a shared counter (Atomics), so the threads keep working
 * while the job's own thread is busy (the cross-validation runs there meanwhile); it posts each
 * finished strip for progress, and stays (listening) until it is terminated. The kernel reads
 * and writes the thread's own (unshared) copies, and each strip is then copied into the shared
 * result: on shared buffers the same kernel measured about 1.5× slower here (a grid-sized local
 * array per thread, 8 bytes a cell, because the kernel indexes whole-grid rows).
 */
const WORKER_SOURCE = (kernel: string) => `
const { parentPort, workerData } = require('node:worker_threads');
const kernel = (${kernel});
const { xs, ys, zs, next, out, nx, ny, x0, y0, dx, dy, stripRows, wasm } = workerData;
const local = new Float64Array(out.length);
parentPort.on('message', () => {});
for (;;) {
	const j0 = Atomics.add(next, 0, stripRows);
	if (j0 >= ny) break;
	const j1 = Math.min(ny, j0 + stripRows);
	kernel(xs, ys, zs, nx, x0, y0, dx, dy, j0, j1, local, wasm);
	out.set(local.subarray(j0 * nx, j1 * nx), j0 * nx);
	parentPort.postMessage({ j0, j1 });
}
`;

/**
 * Threads for one grid job: THERMALITH_GRID_THREADS (validated by the one environment schema;
 * read here from the process because the grid worker script runs without the web server's
 * config), else min(2, available cores). 1 means no threads.
 */
export function gridThreadCount(source: Record<string, string | undefined> = process.env): number {
	const set = gridThreadsSchema.parse(source.THERMALITH_GRID_THREADS);
	return set ?? Math.min(2, availableParallelism());
}

/**
 * A strip runner on `threads` threads (undefined for 1: computeGrid then runs the kernel on its
 * own thread). The threads live for one call and are terminated when it ends, however it ends.
 * `kernel` is replaceable only so a test can make a thread fail.
 */
export function idwThreads(
	threads: number,
	kernel: (...args: Parameters<typeof idwEverySitePower2Rows>) => void = idwEverySitePower2Rows
): IdwStripRunner | undefined {
	if (!(threads > 1)) return undefined;
	const source = WORKER_SOURCE(kernel.toString());
	return async ({ xs, ys, zs }, grid, stripRows, out, onRows, signal) => {
		const { nx, ny, x0, y0, dx, dy } = grid;
		const result = new Float64Array(new SharedArrayBuffer(nx * ny * 8));
		const workerData = {
			// Copied to each thread (plain arrays: the kernel reads them fastest).
			xs,
			ys,
			zs,
			out: result,
			next: new Int32Array(new SharedArrayBuffer(4)),
			nx,
			ny,
			x0,
			y0,
			dx,
			dy,
			stripRows,
			// The kernel's SIMD pass (each thread instantiates it per strip).
			wasm: IDW_SIMD_WASM
		};
		const count = Math.min(threads, Math.ceil(ny / stripRows));
		const workers: Worker[] = [];
		try {
			await new Promise<void>((resolve, reject) => {
				let rowsDone = 0;
				let settled = false;
				// Progress calls run one after another, in order, while the threads go on.
				let progress = Promise.resolve();
				const fail = (err: unknown) => {
					if (settled) return;
					settled = true;
					reject(err);
				};
				if (signal?.aborted) return fail(signal.reason);
				signal?.addEventListener('abort', () => fail(signal.reason), { once: true });
				for (let t = 0; t < count; t++) {
					const w = new Worker(source, { eval: true, workerData });
					workers.push(w);
					w.on('message', ({ j0, j1 }: { j0: number; j1: number }) => {
						if (settled) return;
						out.set(result.subarray(j0 * nx, j1 * nx), j0 * nx);
						rowsDone += j1 - j0;
						const done = rowsDone;
						progress = progress.then(() => onRows(done));
						if (done === ny) {
							progress.then(() => {
								settled = true;
								resolve();
							}, fail);
						} else {
							progress.catch(fail);
						}
					});
					w.on('error', (err) => fail(new GridThreadError(`a grid thread failed: ${err.message}`)));
					w.on('exit', (code) =>
						fail(
							new GridThreadError(
								`a grid thread stopped (exit code ${code}) before its rows were done`
							)
						)
					);
				}
			});
		} finally {
			await Promise.all(workers.map((w) => w.terminate()));
		}
	};
}

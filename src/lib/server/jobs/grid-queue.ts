import type PgBoss from 'pg-boss';
import { computeGrid, MEASUREMENT_ERROR_TREATMENT } from '$lib/grids/compute';
import type { GridPlan } from '$lib/grids/plan';
import type { GridRequest } from '$lib/grids/request';
import { InputError, SingularSystemError } from '$lib/geostats';
import type { Db } from '../db/client';
import { GridThreadError, gridThreadCount, idwThreads } from '../grids/idw-threads';
import {
	failGrid,
	finishGrid,
	gridForJob,
	markGridRunning,
	setGridProgress,
	type GridSample
} from '../repositories/grids';
import { QUEUES } from './queues';

export interface GridJob {
	gridId: string;
}

/** Queue a grid's computation; one job per grid row (a second send for the same row is dropped). */
export async function enqueueGrid(boss: PgBoss, gridId: string): Promise<void> {
	await boss.send(QUEUES.grid.name, { gridId } satisfies GridJob, { singletonKey: gridId });
}

class Superseded extends Error {}

/** Write progress at most this often: every strip would be a write per few milliseconds. */
const PROGRESS_EVERY_MS = 250;

/**
 * Compute one grid. Bad data (a singular kriging system, input the geostatistics refuse) or a
 * failed computing thread fails the grid with its sentence and is not retried; anything else
 * (database down, worker killed) is thrown to pg-boss, which retries the job by its policy.
 */
export async function runGridJob(db: Db, gridId: string): Promise<void> {
	const row = await gridForJob(db, gridId);
	if (!row || row.status === 'done' || row.status === 'failed') return;
	const attempt = await markGridRunning(db, gridId);
	if (attempt === null) return;
	const req = row.request as unknown as GridRequest;
	const plan = row.plan as unknown as GridPlan;
	const samples = row.samples as GridSample[];
	let last = 0;
	try {
		const out = await computeGrid(
			samples.map((s) => ({
				x: s.x,
				y: s.y,
				value: s.heatFlowMWm2,
				...(s.sigmaMWm2 !== null && s.sigmaMWm2 > 0 ? { sigma: s.sigmaMWm2 } : {})
			})),
			plan.grid,
			req,
			async (fraction) => {
				const now = Date.now();
				if (now - last >= PROGRESS_EVERY_MS && fraction < 1) {
					last = now;
					if (!(await setGridProgress(db, gridId, attempt, fraction))) throw new Superseded();
				}
				// Let the web server (when it shares this process) answer requests between strips.
				await new Promise((r) => setImmediate(r));
			},
			{ idwStrips: idwThreads(gridThreadCount()) }
		);
		await finishGrid(
			db,
			gridId,
			attempt,
			{
				variogram: out.variogram,
				measurementError: req.method === 'kriging' ? MEASUREMENT_ERROR_TREATMENT : null,
				empirical: out.empirical,
				crossValidation: out.crossValidation,
				sitesUsed: out.sitesUsed,
				maskedCells: out.maskedCells,
				valueRange: range(out.value),
				sigmaRange: out.sigma ? range(out.sigma) : null
			},
			out.value,
			out.sigma
		);
	} catch (err) {
		// A later run of the same job owns the grid now (this one was taken for dead): stop quietly.
		if (err instanceof Superseded) return;
		// A failed thread ran a deterministic kernel: a retry would fail the same way.
		if (
			err instanceof InputError ||
			err instanceof SingularSystemError ||
			err instanceof GridThreadError
		) {
			await failGrid(db, gridId, attempt, `The grid could not be computed: ${err.message}`);
			return;
		}
		throw err;
	}
}

function range(values: Float32Array): [number, number] | null {
	let lo = Infinity;
	let hi = -Infinity;
	for (const v of values) {
		if (Number.isNaN(v)) continue;
		if (v < lo) lo = v;
		if (v > hi) hi = v;
	}
	return lo <= hi ? [lo, hi] : null;
}

/** Take grid jobs in this process, one at a time (each is CPU-bound). */
export function workGridQueue(boss: PgBoss, db: Db, queue: string = QUEUES.grid.name) {
	return boss.work<GridJob>(queue, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
		await runGridJob(db, job.data.gridId);
	});
}

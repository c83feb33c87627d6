/**
 * A grid job whose worker process is killed mid-computation is not lost: once the job's expiry
 * passes, pg-boss hands it to another worker, which computes the grid afresh from the inputs
 * stored with it. Runs on a pg-boss schema and queue of its own with the product's grid queue
 * policy, except a 20 s expiry and 1 s retry delay so the test does not wait 15 minutes.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import { afterAll, describe, expect, it } from 'vitest';
import { createRandom } from '../../src/lib/foundation/random';
import { gridRequestSchema } from '../../src/lib/grids/request';
import { ANONYMOUS } from '../../src/lib/server/access/viewer';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, grid, site } from '../../src/lib/server/db/schema';
import { workGridQueue } from '../../src/lib/server/jobs/grid-queue';
import { ensureQueues, QUEUES } from '../../src/lib/server/jobs/queues';
import { findOrCreateGrid } from '../../src/lib/server/repositories/grids';
import { testEnv } from './env';

const schema = `pgboss_gridkill_${process.pid}`;
const queue = 'grid-worker-killed-test';
const run = Date.now().toString(36);
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const bosses: PgBoss[] = [];
let datasetId: string | undefined;

afterAll(async () => {
	for (const boss of bosses) await boss.stop({ graceful: false, timeout: 2000 });
	await sql.unsafe(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
	if (datasetId) await db.delete(dataset).where(eq(dataset.id, datasetId));
	await sql.end();
});

/** An invented public dataset of 1,500 sites far from the demo (a grid that takes seconds). */
async function manySites(): Promise<[number, number, number, number]> {
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: 'org-korvald-survey',
			title: `Grid worker kill test ${run}`,
			licence: 'CC0-1.0',
			status: 'published',
			visibility: 'public'
		})
		.returning({ id: dataset.id });
	datasetId = d.id;
	const rnd = createRandom(77).uniform;
	const rows = Array.from({ length: 1500 }, (_, i) => {
		const lon = 120 + rnd();
		const lat = -40 + rnd();
		return {
			datasetId: d.id,
			code: `GK-${i}-${run}`,
			location: { lon, lat },
			heatFlowMWm2: 60 + 20 * Math.sin(lon * 9) * Math.cos(lat * 7) + 5 * rnd(),
			heatFlowSigmaMWm2: 4
		};
	});
	for (let i = 0; i < rows.length; i += 500) await db.insert(site).values(rows.slice(i, i + 500));
	return [120, -40, 121, -39];
}

const gridRow = async (id: string) => (await db.select().from(grid).where(eq(grid.id, id)))[0];

describe('a grid worker killed mid-job', () => {
	it('leaves the job to be retried after its expiry; another worker computes the grid', async () => {
		const boss = new PgBoss({
			connectionString: testEnv.databaseUrl(),
			schema,
			max: 2,
			maintenanceIntervalSeconds: 1
		});
		boss.on('error', (err) => console.error('job queue:', err));
		bosses.push(boss);
		await boss.start();
		await ensureQueues(boss, [{ ...QUEUES.grid, name: queue, expireInSeconds: 20, retryDelay: 1 }]);
		const bbox = await manySites();
		const req = gridRequestSchema.parse({ method: 'kriging', bbox, cellSizeM: 500 });
		const { id, cached } = await findOrCreateGrid(db, ANONYMOUS, req);
		expect(cached).toBe(false);
		const jobId = (await boss.send(queue, { gridId: id }))!;

		// `node --import tsx`, not the tsx command, so SIGKILL kills the worker itself.
		const child = spawn(
			process.execPath,
			['--import', 'tsx', path.resolve('tests/integration/helpers/grid-worker.ts'), schema, queue],
			{ env: { ...process.env }, stdio: ['ignore', 'pipe', 'pipe'] }
		);
		let out = '';
		child.stdout.on('data', (d) => (out += d));
		child.stderr.on('data', (d) => (out += d));
		const exited = new Promise((resolve) => child.once('exit', resolve));
		// Killed once the worker has reported progress, i.e. in the middle of the computation.
		await expect
			.poll(async () => (await gridRow(id)).progress, { timeout: 90_000, interval: 50 })
			.toBeGreaterThan(0);
		const midway = await gridRow(id);
		expect(midway.status).toBe('running');
		expect(midway.progress).toBeLessThan(1);
		child.kill('SIGKILL');
		await exited;
		expect((await gridRow(id)).status).toBe('running');

		await workGridQueue(boss, db, queue);
		await expect
			.poll(async () => (await gridRow(id)).status, { timeout: 150_000, interval: 250 })
			.toBe('done');
		const done = await gridRow(id);
		expect(done.progress).toBe(1);
		// The killed run was superseded: the row belongs to a later attempt.
		expect(done.attempt).toBeGreaterThanOrEqual(2);
		expect(done.valueCells?.byteLength).toBe(
			4 *
				(done.plan as { grid: { nx: number; ny: number } }).grid.nx *
				(done.plan as { grid: { nx: number; ny: number } }).grid.ny
		);
		// The killed worker's attempt failed by expiry, then the retry completed.
		expect((await boss.getJobById(queue, jobId))?.retryCount).toBeGreaterThanOrEqual(1);
	}, 300_000);
});

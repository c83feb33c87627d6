/**
 * An import whose worker process dies mid-way (kill -9 during its transaction, as a crash or a
 * restart would) leaves nothing half-written, and is resumed when the worker starts again: the
 * batch is queued again once its heartbeat is stale and written completely, exactly once. A batch
 * that keeps being interrupted ends failed with a message, never hanging.
 * Runs on a pg-boss schema and queue of its own (the app's own worker would otherwise take the
 * job), with the product's import queue policy except a 5 s expiry, and a 2 s heartbeat staleness
 * (the product's: IMPORT_HEARTBEAT_STALE_S) so the test does not wait a minute.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import { and, count, eq, inArray, sql as dsql } from 'drizzle-orm';
import PgBoss from 'pg-boss';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { importBatch, site } from '../../src/lib/server/db/schema';
import { IMPORT_MAX_ATTEMPTS, runImportBatch } from '../../src/lib/server/imports/run-import';
import {
	enqueueImport,
	resumeInterruptedImports,
	workImportQueue
} from '../../src/lib/server/jobs/import-queue';
import { ensureQueues, QUEUES } from '../../src/lib/server/jobs/queues';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, uploadAndPreview } from './fixtures';
import { type Client, DEMO_PASSWORD, signIn } from './http';

const schema = `pgboss_import_kill_${process.pid}`;
const queue = 'import-worker-killed-test';
const { db, client } = createDb(testEnv.databaseUrl(), { max: 4 });
const bosses: PgBoss[] = [];
let contributor: Client;

const sitesIn = async (datasetId: string) =>
	(await db.select({ n: count() }).from(site).where(eq(site.datasetId, datasetId)))[0].n;
const batchRow = async (id: string) =>
	(await db.select().from(importBatch).where(eq(importBatch.id, id)))[0];

/** A previewed draft of n rows, marked queued as a commit would (without the app's queue). */
async function queuedBatch(n: number, prefix: string) {
	const datasetId = await createDraftDataset(contributor, `Killed import ${prefix} ${Date.now()}`);
	const { batchId, preview } = await uploadAndPreview(
		contributor,
		datasetId,
		`${prefix}.csv`,
		gridCsv(n, prefix)
	);
	expect(preview.canImport).toBe(true);
	await db.update(importBatch).set({ status: 'queued' }).where(eq(importBatch.id, batchId));
	// Whatever the test leaves (the last step below holds a batch "running" with a live-looking
	// heartbeat; a failure may stop anywhere), no batch stays running or queued for later files,
	// where no worker would ever end it.
	onTestFinished(async () => {
		await db
			.update(importBatch)
			.set({ status: 'failed', error: 'test finished', finishedAt: new Date() })
			.where(and(eq(importBatch.id, batchId), inArray(importBatch.status, ['running', 'queued'])));
	});
	return { datasetId, batchId };
}

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
});
afterAll(async () => {
	for (const boss of bosses) await boss.stop({ graceful: false, timeout: 2000 });
	const sql = postgres(testEnv.databaseUrl(), { max: 1, onnotice: () => {} });
	await sql.unsafe(`DROP SCHEMA IF EXISTS "${schema}" CASCADE`);
	await sql.end();
	await client.end();
});

describe('an import whose worker is killed mid-way', () => {
	it('has written nothing, and is resumed and written completely once the worker starts again', async () => {
		const { datasetId, batchId } = await queuedBatch(12_000, 'KILL'); // three chunks of 5000
		const boss = new PgBoss({
			connectionString: testEnv.databaseUrl(),
			schema,
			max: 2,
			maintenanceIntervalSeconds: 1
		});
		boss.on('error', (err) => console.error('job queue:', err));
		bosses.push(boss);
		await boss.start();
		await ensureQueues(boss, [
			{ ...QUEUES.import, name: queue, expireInSeconds: 5, retryDelay: 1, retryBackoff: false }
		]);
		await enqueueImport(boss, batchId, queue);

		// `node --import tsx` so that SIGKILL really kills the worker (see job-worker-killed.spec.ts).
		const child = spawn(
			process.execPath,
			[
				'--import',
				'tsx',
				path.resolve('tests/integration/helpers/hanging-import-worker.ts'),
				schema,
				queue
			],
			{
				env: { ...process.env, DATABASE_URL: testEnv.databaseUrl() },
				stdio: ['ignore', 'pipe', 'pipe']
			}
		);
		let out = '';
		child.stdout.on('data', (d) => (out += d));
		child.stderr.on('data', (d) => (out += d));
		const exited = new Promise((resolve) => child.once('exit', resolve));
		await expect.poll(() => out, { timeout: 60_000, interval: 100 }).toContain('written 5000');

		// Mid-way: progress is visible, the sites are not (they are inside the open transaction).
		expect(await batchRow(batchId)).toMatchObject({ status: 'running', doneRows: 5000 });
		expect(await sitesIn(datasetId)).toBe(0);
		child.kill('SIGKILL');
		await exited;
		// PostgreSQL rolled the dead connection's transaction back: still nothing half-written.
		expect(await sitesIn(datasetId)).toBe(0);

		// The worker starts again (as at a restart): the interrupted batch is queued again for
		// when its heartbeat is stale, and written completely once.
		// Scoped to this batch: the test's own worker must not take another file's batch.
		expect(
			await resumeInterruptedImports(boss, db, { queue, staleAfterS: 2, batchIds: [batchId] })
		).toEqual({ requeued: [batchId], failed: [] });
		await workImportQueue(boss, db, { queue, staleAfterS: 2 });
		await expect
			.poll(async () => (await batchRow(batchId)).status, { timeout: 60_000, interval: 200 })
			.toBe('done');
		const done = await batchRow(batchId);
		expect(done).toMatchObject({ doneRows: 12_000, error: null });
		expect(done.attempts).toBeGreaterThanOrEqual(2);
		expect(await sitesIn(datasetId)).toBe(12_000);
	}, 180_000);

	it(`ends failed with a message after ${IMPORT_MAX_ATTEMPTS} interrupted tries, writing nothing`, async () => {
		const { datasetId, batchId } = await queuedBatch(10, 'GIVEUP');
		// As if three workers had died with it: running, stale heartbeat, three tries counted.
		await db
			.update(importBatch)
			.set({
				status: 'running',
				attempts: IMPORT_MAX_ATTEMPTS,
				heartbeatAt: dsql`now() - interval '1 hour'`
			})
			.where(eq(importBatch.id, batchId));
		expect(await runImportBatch(db, batchId)).toBe('failed');
		const failed = await batchRow(batchId);
		expect(failed.status).toBe('failed');
		expect(failed.error).toMatch(/interrupted 3 times.*nothing was written/);
		expect(await sitesIn(datasetId)).toBe(0);
		// A live worker's batch (fresh heartbeat) is never taken twice.
		await db
			.update(importBatch)
			.set({ status: 'running', attempts: 1, heartbeatAt: dsql`now()` })
			.where(eq(importBatch.id, batchId));
		expect(await runImportBatch(db, batchId)).toBe('skipped');
	});
});

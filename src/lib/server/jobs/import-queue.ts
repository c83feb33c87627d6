import type PgBoss from 'pg-boss';
import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { importBatch } from '../db/schema';
import { IMPORT_HEARTBEAT_STALE_S, runImportBatch, type RunOptions } from '../imports/run-import';
import { QUEUES } from './queues';

export interface ImportJob {
	batchId: string;
}

/** Queue a committed batch for writing. */
export async function enqueueImport(
	boss: PgBoss,
	batchId: string,
	queue: string = QUEUES.import.name
) {
	await boss.send(queue, { batchId } satisfies ImportJob);
}

/**
 * Take import jobs in this process, one at a time (each is one transaction of up to 100 000
 * rows; the machine is small). A job delivered again after a crash is harmless: runImportBatch
 * takes a batch only while it is queued or its worker's heartbeat is stale.
 */
export function workImportQueue(
	boss: PgBoss,
	db: Db,
	options: RunOptions & { queue?: string } = {}
): Promise<string> {
	return boss.work<ImportJob>(
		options.queue ?? QUEUES.import.name,
		{ batchSize: 1, pollingIntervalSeconds: 1 },
		async ([job]) => {
			await runImportBatch(db, job.data.batchId, options);
		}
	);
}

/**
 * At start: imports left running by a process that stopped (a restart, a crash) are queued again
 * for when their heartbeat has gone stale, so they resume from scratch (their transaction was
 * rolled back) instead of waiting for the job's expiry; each try counts towards the limit, after
 * which the batch ends failed with a message. Returns how many were queued.
 */
export async function resumeInterruptedImports(
	boss: PgBoss,
	db: Db,
	options: { queue?: string; staleAfterS?: number } = {}
): Promise<number> {
	const staleAfterS = options.staleAfterS ?? IMPORT_HEARTBEAT_STALE_S;
	const running = await db
		.select({
			id: importBatch.id,
			waitS: sql<number>`greatest(0, ${staleAfterS} - extract(epoch from now() - coalesce(${importBatch.heartbeatAt}, ${importBatch.createdAt})))::float8`
		})
		.from(importBatch)
		.where(and(eq(importBatch.status, 'running')));
	for (const r of running)
		await boss.send(options.queue ?? QUEUES.import.name, { batchId: r.id } satisfies ImportJob, {
			startAfter: Math.ceil(r.waitS) + 1
		});
	return running.length;
}

/** Resume interrupted imports, then take import jobs in this process. */
export async function startImportWorker(boss: PgBoss, db: Db) {
	const resumed = await resumeInterruptedImports(boss, db);
	if (resumed) console.warn(`${resumed} interrupted import(s) queued again`);
	await workImportQueue(boss, db);
}

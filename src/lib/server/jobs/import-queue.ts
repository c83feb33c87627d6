import type PgBoss from 'pg-boss';
import type { Db } from '../db/client';
import { recoverInterruptedImports, type Recovered } from '../imports/interrupted';
import { runImportBatch, type RunOptions } from '../imports/run-import';
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
 * At start: imports left running by a process that stopped (a restart, a crash) are resumed
 * (queued again, at once or for when their heartbeat is stale, to run from scratch: their
 * transaction was rolled back) while tries remain, else ended failed with a message; the rule is
 * `interruptedImportAction`. pg-boss's own retry after the job's expiry is the second net.
 */
export function resumeInterruptedImports(
	boss: PgBoss,
	db: Db,
	options: { queue?: string; staleAfterS?: number; batchIds?: string[] } = {}
): Promise<Recovered> {
	const queue = options.queue ?? QUEUES.import.name;
	return recoverInterruptedImports(
		db,
		(batchId, startAfter) => boss.send(queue, { batchId } satisfies ImportJob, { startAfter }),
		options
	);
}

/** Resume or end interrupted imports, then take import jobs in this process. */
export async function startImportWorker(boss: PgBoss, db: Db) {
	const { requeued, failed } = await resumeInterruptedImports(boss, db);
	if (requeued.length) console.warn(`${requeued.length} interrupted import(s) queued again`);
	if (failed.length) console.warn(`${failed.length} interrupted import(s) out of tries: failed`);
	await workImportQueue(boss, db);
}

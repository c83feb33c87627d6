import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { importBatch } from '../db/schema';

/** A running import whose heartbeat is older than this lost its worker (killed, crashed). */
export const IMPORT_HEARTBEAT_STALE_S = 60;
/** A batch taken this many times without finishing is failed instead of tried again. */
export const IMPORT_MAX_ATTEMPTS = 3;

/** The batch's last sign of life: its worker's heartbeat, or its creation before any take. */
export const lastSignOfLife = sql`coalesce(${importBatch.heartbeatAt}, ${importBatch.createdAt})`;

export type InterruptedAction =
	/** Its worker may still be alive: look again once the heartbeat is stale. */
	| { kind: 'wait'; afterS: number }
	/** Its worker is gone and tries remain: run it again from scratch. */
	| { kind: 'resume' }
	/** Its worker is gone and no tries remain: end it with this message. */
	| { kind: 'fail'; message: string };

/**
 * The one rule for an import left "running": resume it if tries remain and its heartbeat is
 * stale, else fail it visibly. Its transaction was rolled back when its worker's connection
 * closed, so either way nothing of it was written. `attempts` counts the takes so far.
 */
export function interruptedImportAction(batch: {
	attempts: number;
	staleInS: number;
}): InterruptedAction {
	if (batch.staleInS > 0) return { kind: 'wait', afterS: batch.staleInS };
	if (batch.attempts < IMPORT_MAX_ATTEMPTS) return { kind: 'resume' };
	return {
		kind: 'fail',
		message: `The import was interrupted ${IMPORT_MAX_ATTEMPTS} times and has stopped; nothing was written. Import the file again.`
	};
}

/** Queue the batch to be taken after `startAfterS` seconds. */
export type Requeue = (batchId: string, startAfterS: number) => Promise<unknown>;

export interface Recovered {
	/** Queued again (now, or for when their heartbeat is stale). */
	requeued: string[];
	/** Out of tries: ended failed with a message. */
	failed: string[];
}

/**
 * When a worker starts: apply `interruptedImportAction` to every import left running (by a
 * restart or a crash). `batchIds` limits it to those batches (a caller that owns them).
 */
export async function recoverInterruptedImports(
	db: Db,
	requeue: Requeue,
	options: { staleAfterS?: number; batchIds?: string[] } = {}
): Promise<Recovered> {
	const staleAfterS = options.staleAfterS ?? IMPORT_HEARTBEAT_STALE_S;
	const running = await db
		.select({
			id: importBatch.id,
			attempts: importBatch.attempts,
			staleInS: sql<number>`greatest(0, ${staleAfterS} - extract(epoch from now() - ${lastSignOfLife}))::float8`
		})
		.from(importBatch)
		.where(
			and(
				eq(importBatch.status, 'running'),
				options.batchIds ? inArray(importBatch.id, options.batchIds) : undefined
			)
		);
	const recovered: Recovered = { requeued: [], failed: [] };
	for (const batch of running) {
		const action = interruptedImportAction(batch);
		if (action.kind === 'fail') {
			// Only if no worker took it meanwhile (a take counts one more attempt).
			const ended = await db
				.update(importBatch)
				.set({ status: 'failed', error: action.message, doneRows: 0, finishedAt: new Date() })
				.where(
					and(
						eq(importBatch.id, batch.id),
						eq(importBatch.status, 'running'),
						eq(importBatch.attempts, batch.attempts)
					)
				)
				.returning({ id: importBatch.id });
			if (ended.length) recovered.failed.push(batch.id);
		} else {
			await requeue(batch.id, action.kind === 'wait' ? Math.ceil(action.afterS) + 1 : 0);
			recovered.requeued.push(batch.id);
		}
	}
	return recovered;
}

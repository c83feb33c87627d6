import { and, eq, sql } from 'drizzle-orm';
import type { SiteDraft } from '$lib/imports';
import type { Db } from '../db/client';
import { dataset, importBatch } from '../db/schema';
import { recordAudit } from '../repositories/audit';
import { INSERT_CHUNK_ROWS, insertSiteChunk } from './bulk-insert';
import {
	IMPORT_HEARTBEAT_STALE_S,
	IMPORT_MAX_ATTEMPTS,
	interruptedImportAction,
	lastSignOfLife
} from './interrupted';

export { IMPORT_HEARTBEAT_STALE_S, IMPORT_MAX_ATTEMPTS };

export interface RunOptions {
	staleAfterS?: number;
	/** Called inside the transaction after each chunk (tests use it to stop a worker mid-way). */
	afterChunk?: (done: number, total: number) => Promise<void>;
}

export type RunOutcome = 'done' | 'failed' | 'skipped';

/**
 * Write a queued batch's sites in ONE transaction, in chunks of INSERT_CHUNK_ROWS, and mark it
 * done in the same transaction, so the sites and the "done" are committed together or not at
 * all. Progress and a heartbeat are written from outside the transaction after each chunk.
 *
 * A batch is taken only when it is queued, or running with a stale heartbeat (its worker died:
 * PostgreSQL rolled its transaction back when the connection closed), so a job delivered twice
 * writes once; a batch out of tries (`interruptedImportAction`) ends failed. A failure rolls everything back and is recorded on the batch with a clear message.
 */
export async function runImportBatch(
	db: Db,
	batchId: string,
	options: RunOptions = {}
): Promise<RunOutcome> {
	const staleAfterS = options.staleAfterS ?? IMPORT_HEARTBEAT_STALE_S;
	const [taken] = await db
		.update(importBatch)
		.set({
			status: 'running',
			attempts: sql`${importBatch.attempts} + 1`,
			heartbeatAt: sql`now()`,
			doneRows: 0
		})
		.where(
			and(
				eq(importBatch.id, batchId),
				sql`(${importBatch.status} = 'queued' OR (${importBatch.status} = 'running' AND ${lastSignOfLife} < now() - make_interval(secs => ${staleAfterS})))`
			)
		)
		.returning({
			attempts: importBatch.attempts,
			datasetId: importBatch.datasetId,
			sites: importBatch.sites,
			createdBy: importBatch.createdBy,
			fileName: importBatch.fileName
		});
	if (!taken) return 'skipped';
	const fail = async (message: string) => {
		await db
			.update(importBatch)
			.set({ status: 'failed', error: message, doneRows: 0, finishedAt: new Date() })
			.where(eq(importBatch.id, batchId));
		return 'failed' as const;
	};
	// Taken while queued or stale: the rule for interrupted imports says whether tries remain
	// (counting the takes before this one).
	const action = interruptedImportAction({ attempts: taken.attempts - 1, staleInS: 0 });
	if (action.kind === 'fail') return fail(action.message);
	const rows = (taken.sites ?? []) as SiteDraft[];
	try {
		await db.transaction(async (tx) => {
			for (let i = 0; i < rows.length; i += INSERT_CHUNK_ROWS) {
				await insertSiteChunk(tx, taken.datasetId, batchId, rows.slice(i, i + INSERT_CHUNK_ROWS));
				const done = Math.min(rows.length, i + INSERT_CHUNK_ROWS);
				await db
					.update(importBatch)
					.set({ doneRows: done, heartbeatAt: sql`now()` })
					.where(eq(importBatch.id, batchId));
				await options.afterChunk?.(done, rows.length);
			}
			await tx.execute(sql`UPDATE dataset SET updated_at = now() WHERE id = ${taken.datasetId}`);
			// The audit row is written with the sites, in the same transaction: both or neither.
			await recordAudit(
				tx,
				{ userId: taken.createdBy },
				{
					action: 'import',
					organisationId: sql`(SELECT ${dataset.organisationId} FROM ${dataset} WHERE ${dataset.id} = ${taken.datasetId})`,
					datasetId: taken.datasetId,
					details: { importId: batchId, fileName: taken.fileName, rows: rows.length }
				}
			);
			await tx
				.update(importBatch)
				.set({ status: 'done', doneRows: rows.length, finishedAt: new Date(), sites: null })
				.where(eq(importBatch.id, batchId));
		});
		return 'done';
	} catch (err) {
		console.error(`[import ${batchId}] rolled back`, err);
		await recordFailure(
			db,
			batchId,
			(err as { code?: string }).code === '23505'
				? 'A site code in the file was added to the dataset meanwhile; nothing was written.'
				: 'The import failed and was rolled back; nothing was written.'
		);
		return 'failed';
	}
}

/**
 * Mark the batch failed. PostgreSQL itself may be what failed (stopped, restarting), so keep
 * trying for a few minutes rather than give up at once (the batch would stay "running" until a
 * worker restarts); past that, the stale-heartbeat rule ends it.
 */
async function recordFailure(db: Db, batchId: string, message: string, tries = 150, waitMs = 2000) {
	for (let attempt = 1; ; attempt++) {
		try {
			await db
				.update(importBatch)
				.set({ status: 'failed', error: message, doneRows: 0, finishedAt: new Date() })
				.where(eq(importBatch.id, batchId));
			return;
		} catch (err) {
			if (attempt >= tries) {
				console.error(`[import ${batchId}] could not record the failure`, err);
				return;
			}
			await new Promise((r) => setTimeout(r, waitMs));
		}
	}
}

import { error } from '@sveltejs/kit';
import { eq, sql } from 'drizzle-orm';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, importBatch, site, type NewSite } from '../db/schema';
import { recordAudit, type DbOrTx } from '../repositories/audit';
import type { ImportPayload } from './payload';
import { serverPreview } from './server-preview';

const CHUNK_ROWS = 1000;

/**
 * Validate again and, when nothing blocks, insert every accepted row in ONE transaction, in the
 * background. Progress is written to import_batch from outside the transaction, so any app
 * instance can report it; a failure rolls the whole file back and records why.
 */
export async function startImport(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	payload: ImportPayload
) {
	const { preview, previousImport } = await serverPreview(db, viewer, datasetId, payload);
	if (!preview.canImport || preview.errorCount > 0) {
		error(
			400,
			`${preview.errorCount} rows have errors; fix them (see the preview report) and import again. Nothing was written.`
		);
	}
	if (previousImport && !payload.allowReimport) {
		error(
			409,
			`This file was imported into this dataset on ${previousImport.at.toISOString().slice(0, 10)}. Confirm to import it again.`
		);
	}
	const rows: NewSite[] = preview.rows.flatMap((r) => (r.site ? [{ ...r.site, datasetId }] : []));
	const [batch] = await db
		.insert(importBatch)
		.values({
			datasetId,
			fileName: payload.fileName,
			fileSha256: payload.sha256,
			totalRows: rows.length,
			createdBy: viewer.userId
		})
		.returning({ id: importBatch.id });
	void insertAll(db, batch.id, datasetId, rows, async (tx) => {
		await recordAudit(tx, viewer, {
			action: 'import',
			organisationId: sql`(SELECT ${dataset.organisationId} FROM ${dataset} WHERE ${dataset.id} = ${datasetId})`,
			datasetId,
			details: { importId: batch.id, fileName: payload.fileName, rows: rows.length }
		});
	});
	return { batchId: batch.id, rows: rows.length, warnings: preview.warningCount };
}

/** Insert sites in one transaction, in chunks, calling onChunk (outside the transaction) after each. */
export async function insertSites(
	db: Db,
	datasetId: string,
	rows: NewSite[],
	onChunk: (done: number) => Promise<void>,
	/** Written in the same transaction (the audit row of the import). */
	record?: (tx: DbOrTx) => Promise<void>
) {
	await db.transaction(async (tx) => {
		for (let i = 0; i < rows.length; i += CHUNK_ROWS) {
			await tx.insert(site).values(rows.slice(i, i + CHUNK_ROWS));
			await onChunk(Math.min(rows.length, i + CHUNK_ROWS));
		}
		await tx.execute(sql`UPDATE dataset SET updated_at = now() WHERE id = ${datasetId}`);
		await record?.(tx);
	});
}

async function insertAll(
	db: Db,
	batchId: string,
	datasetId: string,
	rows: NewSite[],
	record: (tx: DbOrTx) => Promise<void>
) {
	try {
		await insertSites(
			db,
			datasetId,
			rows,
			async (done) => {
				await db.update(importBatch).set({ doneRows: done }).where(eq(importBatch.id, batchId));
			},
			record
		);
		await db
			.update(importBatch)
			.set({ status: 'done', finishedAt: new Date() })
			.where(eq(importBatch.id, batchId));
	} catch (err) {
		console.error(`[import ${batchId}] rolled back`, err);
		const message =
			(err as { code?: string }).code === '23505'
				? 'A site code in the file was added to the dataset meanwhile; nothing was written.'
				: 'The import failed and was rolled back; nothing was written.';
		await recordFailure(db, batchId, message);
	}
}

/**
 * Mark the batch failed. PostgreSQL itself may be what failed (stopped, restarting), so keep
 * trying for a few minutes rather than give up at once or leave a rejected promise that nothing
 * handles (which would end the process); past that, failStaleImports (stale.ts) ends the batch.
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

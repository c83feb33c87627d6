import { GetObjectCommand } from '@aws-sdk/client-s3';
import { error } from '@sveltejs/kit';
import { and, eq, sql } from 'drizzle-orm';
import type {
	PreviewResponse,
	RowEdits,
	UploadedTable,
	ImportSettings
} from '$lib/schemas/imports';
import { notFound, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, importBatch } from '../db/schema';
import { requireUpload } from '../guards';
import { readyAttachmentForViewer } from '../repositories/attachments';
import { recordAudit } from '../repositories/audit';
import { datasetForViewer } from '../repositories/datasets';
import { bucket, s3 } from '../storage';
import { draftFromBytes, previewBatchAs, selectBatch, type ChangeableBatch } from './draft';

export { MAX_IMPORT_ROWS, type ChangeableBatch } from './draft';

/** The upload right on the dataset, checked on every step (rights may change between steps). */
export async function requireUploadRight(db: Db, viewer: Viewer, datasetId: string) {
	const found = await datasetForViewer(db, viewer, datasetId);
	requireUpload(found);
	return found;
}

/**
 * A batch its creator may still work on: anyone else (and an unknown id) gets the same 404, and
 * the upload right on its dataset is checked again.
 */
export async function batchForChange(db: Db, viewer: Viewer, id: string): Promise<ChangeableBatch> {
	const batch = await selectBatch(db, id);
	if (!batch || !viewer.userId || batch.createdBy !== viewer.userId) notFound();
	await requireUploadRight(db, viewer, batch.datasetId);
	return batch;
}

async function readObject(key: string): Promise<Uint8Array> {
	const res = await s3()
		.send(new GetObjectCommand({ Bucket: bucket(), Key: key }))
		.catch((err) => {
			console.error('import: reading the uploaded file from the object store failed', err);
			error(503, 'The file store could not be reached; try again.');
		});
	return res.Body!.transformToByteArray();
}

/**
 * Start an import from a file uploaded as an attachment of the dataset (kept there as the
 * import's provenance): the server reads and parses it once and keeps the parsed table with a
 * new draft batch. Nothing is written to the dataset's sites.
 */
export async function startImport(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	attachmentId: string
): Promise<UploadedTable> {
	await requireUploadRight(db, viewer, datasetId);
	const file = await readyAttachmentForViewer(db, viewer, attachmentId);
	if (file.datasetId !== datasetId) notFound();
	const bytes = await readObject(file.objectKey);
	return draftFromBytes(
		db,
		{
			datasetId,
			attachmentId: file.id,
			fileName: file.fileName,
			sha256: file.sha256 ?? '',
			createdBy: viewer.userId
		},
		bytes
	);
}

/**
 * The preview of a draft with the contributor's settings and edits: every check of the library,
 * plus the ones only the server can make (visible sites nearby, codes already in the dataset, the
 * same file imported before). Kept with the batch, with the sites a commit would write when
 * nothing blocks; each preview gets a new revision, which a commit must name.
 */
export async function previewImport(
	db: Db,
	viewer: Viewer,
	batch: ChangeableBatch,
	settings: ImportSettings,
	edits: RowEdits
): Promise<PreviewResponse> {
	if (batch.status !== 'draft' && batch.status !== 'failed')
		error(409, `This import is ${batch.status}; it can no longer be changed.`);
	return previewBatchAs(db, viewer, batch, settings, edits);
}

/**
 * Commit a previewed draft: exactly the sites of the preview revision the contributor confirmed
 * are queued for writing (all or none, by the worker). Returns the batch id to follow.
 */
export async function commitImport(
	db: Db,
	batch: ChangeableBatch,
	request: { revision: number; allowReimport: boolean },
	enqueue: (batchId: string) => Promise<void>
) {
	const batchId = batch.id;
	if (batch.status !== 'draft') error(409, `This import is ${batch.status} already.`);
	if (batch.revision !== request.revision)
		error(409, 'The preview changed meanwhile (another tab?); check the rows again.');
	if (!batch.hasSites)
		error(
			400,
			'Some rows still have errors: correct or exclude them in the preview, then import. Nothing was written.'
		);
	const previous = (batch.preview as PreviewResponse | null)?.previousImport;
	if (previous && !request.allowReimport)
		error(
			409,
			`This file was imported into this dataset on ${previous.at.slice(0, 10)}. Confirm to import it again.`
		);
	// Queued and recorded together: the audit log says who started which import when, also when
	// the write itself fails later (that is `import`, written with the sites by the worker).
	const queued = await db.transaction(async (tx) => {
		const [row] = await tx
			.update(importBatch)
			.set({ status: 'queued', doneRows: 0 })
			.where(
				and(
					eq(importBatch.id, batchId),
					eq(importBatch.status, 'draft'),
					eq(importBatch.revision, request.revision)
				)
			)
			.returning({ id: importBatch.id, totalRows: importBatch.totalRows });
		if (!row) return null;
		await recordAudit(
			tx,
			{ userId: batch.createdBy },
			{
				action: 'import-start',
				organisationId: sql`(SELECT ${dataset.organisationId} FROM ${dataset} WHERE ${dataset.id} = ${batch.datasetId})`,
				datasetId: batch.datasetId,
				details: { importId: batchId, fileName: batch.fileName, rows: row.totalRows }
			}
		);
		return row;
	});
	if (!queued) error(409, 'The import was committed or changed meanwhile.');
	try {
		await enqueue(batchId);
	} catch (err) {
		console.error(`[import ${batchId}] could not be queued`, err);
		await db.update(importBatch).set({ status: 'draft' }).where(eq(importBatch.id, batchId));
		error(503, 'The job queue could not be reached; nothing was written. Try again.');
	}
	return { batchId, rows: queued.totalRows };
}

import { error } from '@sveltejs/kit';
import { and, eq, lt, sql } from 'drizzle-orm';
import { datasetRights, notFound, requireUuid, visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { attachment, dataset, site } from '../db/schema';
import type { VisibleDataset } from './datasets';
import { recordAudit } from './audit';

type Attachment = typeof attachment.$inferSelect;
declare const changeable: unique symbol;
/** A file the viewer was found allowed to change; only `attachmentForChange` makes one. */
export type ChangeableAttachment = Attachment & { [changeable]: true };

async function visibleAttachment(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [row] = await db
		.select({ attachment, dataset })
		.from(attachment)
		.innerJoin(dataset, eq(attachment.datasetId, dataset.id))
		.where(and(eq(attachment.id, id), visibleDatasets(viewer)));
	if (!row) notFound();
	return row;
}

/** A checked file of a dataset the viewer may see (download, thumbnail); the common 404 otherwise. */
export async function readyAttachmentForViewer(db: Db, viewer: Viewer, id: string) {
	const row = await visibleAttachment(db, viewer, id);
	if (row.attachment.status !== 'ready') notFound();
	return row.attachment;
}

/**
 * A file the viewer may change: send its content or delete it. Needs the upload right on its
 * dataset (403 with the reason). Only the person who announced a file sends its content;
 * deleting someone else's file needs `dataset:delete` (curators and owners), so a contributor
 * cannot remove the files others attached.
 */
export async function attachmentForChange(
	db: Db,
	viewer: Viewer,
	id: string,
	purpose: 'content' | 'delete'
): Promise<ChangeableAttachment> {
	const row = await visibleAttachment(db, viewer, id);
	const rights = datasetRights(viewer, row.dataset);
	if (!rights.can.upload) error(403, rights.uploadRefusal ?? 'You may not change files here.');
	const own = row.attachment.uploadedBy !== null && row.attachment.uploadedBy === viewer.userId;
	if (!own && (purpose === 'content' || !rights.can.deleteAnyFile)) {
		error(
			403,
			purpose === 'content'
				? 'Only the person who announced this file can send its content.'
				: 'You may delete only files you uploaded; ask a curator of the organisation.'
		);
	}
	return row.attachment as ChangeableAttachment;
}

/**
 * Record an announced file as pending, uploaded by the viewer. `target` is a dataset the caller
 * found open to the viewer's uploads (guards.ts `requireUpload`); a site must be one of its own.
 */
export async function addPendingAttachment(
	db: Db,
	viewer: Viewer,
	target: VisibleDataset,
	file: { siteId?: string | null; fileName: string; sizeBytes: number; objectKey: string }
) {
	const datasetId = target.dataset.id;
	if (file.siteId) {
		const [s] = await db
			.select({ id: site.id })
			.from(site)
			.where(and(eq(site.id, file.siteId), eq(site.datasetId, datasetId)));
		if (!s) error(404, 'No such site in this dataset.');
	}
	const [row] = await db
		.insert(attachment)
		.values({
			datasetId,
			siteId: file.siteId ?? null,
			objectKey: file.objectKey,
			fileName: file.fileName.slice(0, 255),
			sizeBytes: file.sizeBytes,
			uploadedBy: viewer.userId
		})
		.returning({ id: attachment.id });
	return row;
}

/**
 * Mark a pending file ready with its checked object. Only while it is still pending and the
 * viewer's own, in one conditional update, so of two racing uploads exactly one wins; null when
 * this one lost (or the file was deleted meanwhile).
 */
export async function markAttachmentReady(
	db: Db,
	viewer: Viewer,
	file: ChangeableAttachment,
	checked: { objectKey: string; contentType: string; sha256: string; thumbnailKey: string | null }
): Promise<Attachment | null> {
	const userId = viewer.userId;
	if (!userId) return null;
	return db.transaction(async (tx) => {
		const [updated] = await tx
			.update(attachment)
			.set({ status: 'ready', ...checked })
			.where(
				and(
					eq(attachment.id, file.id),
					eq(attachment.status, 'pending'),
					eq(attachment.uploadedBy, userId)
				)
			)
			.returning();
		if (!updated) return null;
		// The file is the organisation's from now on: recorded with the change.
		await recordAudit(tx, viewer, {
			action: 'upload',
			organisationId: sql`(SELECT ${dataset.organisationId} FROM ${dataset} WHERE ${dataset.id} = ${updated.datasetId})`,
			datasetId: updated.datasetId,
			details: { fileName: updated.fileName, sizeBytes: updated.sizeBytes, siteId: updated.siteId }
		});
		return updated;
	});
}

/** Forget a file whose upload failed, only while it is still pending (a racing winner stays). */
export async function forgetPendingAttachment(db: Db, file: ChangeableAttachment) {
	await db
		.delete(attachment)
		.where(and(eq(attachment.id, file.id), eq(attachment.status, 'pending')));
}

/** Delete a file's row (its objects are removed by the caller). */
export async function deleteAttachmentRow(db: Db, file: ChangeableAttachment) {
	await db.delete(attachment).where(eq(attachment.id, file.id));
}

/**
 * Housekeeping (a system job, not a viewer): forget files announced before `cutoff` whose bytes
 * never arrived. Returns how many were removed.
 */
export async function expirePendingAttachments(db: Db, cutoff: Date): Promise<number> {
	const removed = await db
		.delete(attachment)
		.where(and(eq(attachment.status, 'pending'), lt(attachment.uploadedAt, cutoff)))
		.returning({ id: attachment.id });
	return removed.length;
}

import { error } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { datasetRights, notFound, requireUuid, visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { attachment, dataset } from '../db/schema';

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
 * A file the viewer may change: finish its upload or delete it. Needs the upload right on its
 * dataset (403 with the reason). Only its uploader finishes an upload; deleting someone else's
 * file needs `dataset:delete` (curators and owners), so a contributor cannot remove the files
 * others attached.
 */
export async function attachmentForChange(
	db: Db,
	viewer: Viewer,
	id: string,
	purpose: 'complete' | 'delete'
) {
	const row = await visibleAttachment(db, viewer, id);
	const rights = datasetRights(viewer, row.dataset);
	if (!rights.can.upload) error(403, rights.uploadRefusal ?? 'You may not change files here.');
	const own = row.attachment.uploadedBy !== null && row.attachment.uploadedBy === viewer.userId;
	if (!own && (purpose === 'complete' || !rights.can.deleteAnyFile)) {
		error(
			403,
			purpose === 'complete'
				? 'Only the person who uploaded this file can finish its upload.'
				: 'You may delete only files you uploaded; ask a curator of the organisation.'
		);
	}
	return row.attachment;
}

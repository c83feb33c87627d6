import { createHash, randomUUID } from 'node:crypto';
import {
	DeleteObjectCommand,
	GetObjectCommand,
	HeadObjectCommand,
	PutObjectCommand
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { error } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { safeFileName, sniffFile } from '$lib/files/sniff';
import { notFound, type Viewer } from './access';
import { config } from './config';
import type { Db } from './db/client';
import { attachment, site } from './db/schema';
import { requireUpload } from './guards';
import { attachmentForChange, readyAttachmentForViewer } from './repositories/attachments';
import { datasetForViewer } from './repositories/datasets';
import { bucket, s3 } from './storage';

const UPLOAD_URL_SECONDS = 15 * 60;
const DOWNLOAD_URL_SECONDS = 60;
const THUMBNAIL_PX = 320;
const MB = 1024 * 1024;

/** Start an upload: check the right to upload and the size, record a pending file, presign a PUT. */
export async function startAttachmentUpload(
	db: Db,
	viewer: Viewer,
	input: { datasetId: string; siteId?: string | null; fileName: string; sizeBytes: number }
) {
	const found = await datasetForViewer(db, viewer, input.datasetId);
	requireUpload(found);
	const max = config().ATTACHMENT_MAX_BYTES;
	if (!(input.sizeBytes > 0)) error(400, 'The file is empty.');
	if (input.sizeBytes > max) {
		error(
			413,
			`The file is ${(input.sizeBytes / MB).toFixed(1)} MB; the limit is ${(max / MB).toFixed(0)} MB.`
		);
	}
	if (input.siteId) {
		const [s] = await db
			.select({ id: site.id })
			.from(site)
			.where(and(eq(site.id, input.siteId), eq(site.datasetId, input.datasetId)));
		if (!s) error(404, 'No such site in this dataset.');
	}
	const objectKey = `datasets/${input.datasetId}/${randomUUID()}/${safeFileName(input.fileName)}`;
	const [row] = await db
		.insert(attachment)
		.values({
			datasetId: input.datasetId,
			siteId: input.siteId ?? null,
			objectKey,
			fileName: input.fileName.slice(0, 255),
			sizeBytes: input.sizeBytes,
			uploadedBy: viewer.userId
		})
		.returning({ id: attachment.id });
	const uploadUrl = await getSignedUrl(
		s3(),
		new PutObjectCommand({ Bucket: bucket(), Key: objectKey, ContentLength: input.sizeBytes }),
		{ expiresIn: UPLOAD_URL_SECONDS }
	);
	return { id: row.id, uploadUrl };
}

async function readObject(key: string): Promise<Buffer> {
	const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
	return Buffer.from(await res.Body!.transformToByteArray());
}

/** Remove a file's objects and row (used when a check fails and on delete). */
async function discard(
	db: Db,
	row: { id: string; objectKey: string; thumbnailKey: string | null }
) {
	for (const key of [row.objectKey, row.thumbnailKey]) {
		if (key)
			await s3()
				.send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }))
				.catch(() => {});
	}
	await db.delete(attachment).where(eq(attachment.id, row.id));
}

/**
 * Finish an upload: the object must exist with the announced size, its type is sniffed from the
 * bytes (executables refused), its SHA-256 stored, and images get a thumbnail. A file that fails
 * a check is deleted again, so nothing half-accepted stays behind.
 */
export async function completeAttachmentUpload(db: Db, viewer: Viewer, id: string) {
	const row = await attachmentForChange(db, viewer, id, 'complete');
	if (row.status === 'ready') return row;
	const head = await s3()
		.send(new HeadObjectCommand({ Bucket: bucket(), Key: row.objectKey }))
		.catch(() => null);
	if (!head) error(400, 'The upload did not reach the file store; try again.');
	if (
		head.ContentLength !== row.sizeBytes ||
		(head.ContentLength ?? 0) > config().ATTACHMENT_MAX_BYTES
	) {
		await discard(db, row);
		error(400, 'The stored file does not have the announced size; it was removed.');
	}
	const bytes = await readObject(row.objectKey);
	const sniffed = sniffFile(row.fileName, bytes.subarray(0, 4100), await fileTypeFromBuffer(bytes));
	if (!sniffed.ok) {
		await discard(db, row);
		error(415, `Refused: ${sniffed.reason}.`);
	}
	let thumbnailKey: string | null = null;
	if (sniffed.isImage) {
		try {
			const thumb = await sharp(bytes)
				.rotate()
				.resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside' })
				.webp({ quality: 80 })
				.toBuffer();
			thumbnailKey = `${row.objectKey}.thumb.webp`;
			await s3().send(
				new PutObjectCommand({
					Bucket: bucket(),
					Key: thumbnailKey,
					Body: thumb,
					ContentType: 'image/webp'
				})
			);
		} catch {
			// A damaged image is still kept as a file; it just gets no preview.
			thumbnailKey = null;
		}
	}
	const [updated] = await db
		.update(attachment)
		.set({
			status: 'ready',
			contentType: sniffed.contentType,
			sha256: createHash('sha256').update(bytes).digest('hex'),
			thumbnailKey
		})
		.where(eq(attachment.id, id))
		.returning();
	return updated;
}

/** A short-lived download link, issued only after the viewer may see the file's dataset. */
export async function attachmentDownloadUrl(
	db: Db,
	viewer: Viewer,
	id: string,
	variant: 'file' | 'thumbnail'
) {
	const row = await readyAttachmentForViewer(db, viewer, id);
	const key = variant === 'thumbnail' ? row.thumbnailKey : row.objectKey;
	if (!key) notFound();
	const disposition = `${variant === 'thumbnail' ? 'inline' : 'attachment'}; filename*=UTF-8''${encodeURIComponent(row.fileName)}`;
	return getSignedUrl(
		s3(),
		new GetObjectCommand({
			Bucket: bucket(),
			Key: key,
			ResponseContentDisposition: disposition,
			ResponseContentType:
				variant === 'thumbnail' ? 'image/webp' : (row.contentType ?? 'application/octet-stream')
		}),
		{ expiresIn: DOWNLOAD_URL_SECONDS }
	);
}

export async function deleteAttachment(db: Db, viewer: Viewer, id: string) {
	const row = await attachmentForChange(db, viewer, id, 'delete');
	await discard(db, row);
}

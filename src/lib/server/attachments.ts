import { createHash, randomUUID } from 'node:crypto';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { error } from '@sveltejs/kit';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { safeFileName, sniffFile } from '$lib/files/sniff';
import { notFound, type Viewer } from './access';
import { config } from './config';
import type { Db } from './db/client';
import { checkedStream } from './files/checked-stream';
import { readBodyUpTo } from './files/read-body';
import { requireUpload } from './guards';
import {
	addPendingAttachment,
	attachmentForChange,
	deleteAttachmentRow,
	forgetPendingAttachment,
	markAttachmentReady,
	readyAttachmentForViewer,
	type ChangeableAttachment
} from './repositories/attachments';
import { datasetForViewer } from './repositories/datasets';
import { bucket, s3 } from './storage';

/*
 * Browsers never talk to the object store: they send a file's bytes to the app
 * (PUT /api/v1/attachments/{id}/content), which checks, hashes and stores them with its own keys
 * in one step, and they read files back through the app after the access check. So there is no
 * presigned URL that could be replayed to swap a checked file, the store needs no CORS rule and
 * no port reachable from other machines, and a remote browser works like a local one.
 * Who may do what with a file is decided by the access layer (repositories/attachments.ts);
 * this module only moves and checks the bytes.
 */

const THUMBNAIL_PX = 320;
const MB = 1024 * 1024;

/** Where the browser sends a file's bytes: a path on the app's own origin. */
export const contentPath = (id: string) => `/api/v1/attachments/${id}/content`;

/** Start an upload: check the right to upload and the size, record a pending file. */
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
	const row = await addPendingAttachment(db, viewer, found, {
		siteId: input.siteId,
		fileName: input.fileName,
		sizeBytes: input.sizeBytes,
		objectKey: newObjectKey(input.datasetId, input.fileName)
	});
	return { id: row.id, uploadUrl: contentPath(row.id) };
}

function newObjectKey(datasetId: string, fileName: string) {
	return `datasets/${datasetId}/${randomUUID()}/${safeFileName(fileName)}`;
}

async function removeObjects(keys: (string | null)[]) {
	for (const key of keys) {
		if (key)
			await s3()
				.send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }))
				.catch(() => {});
	}
}

/** Remove a file's objects and row (used when a check fails and on delete). */
async function discard(db: Db, row: ChangeableAttachment) {
	await removeObjects([row.objectKey, row.thumbnailKey]);
	await deleteAttachmentRow(db, row);
}

async function thumbnailOf(bytes: Buffer): Promise<Buffer | null> {
	try {
		return await sharp(bytes)
			.rotate()
			.resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside' })
			.webp({ quality: 80 })
			.toBuffer();
	} catch {
		// A damaged image is still kept as a file; it just gets no preview.
		return null;
	}
}

/**
 * Receive a pending file's bytes from the person who announced it (access layer): they must have
 * the announced size; the type is sniffed from the bytes (executables refused), the SHA-256
 * taken, images get a thumbnail, and only then is the file
 * stored and marked ready. Once ready its content can never be replaced: a later PUT is refused
 * (409), and the objects are written under a key of this attempt's own, which becomes the file's
 * only if the row was still pending at that moment, so two racing uploads cannot mix.
 * A file that fails a check is deleted again, so nothing half-accepted stays behind.
 */
export async function receiveAttachmentContent(
	db: Db,
	viewer: Viewer,
	id: string,
	body: ReadableStream<Uint8Array> | null
) {
	const row = await attachmentForChange(db, viewer, id, 'content');
	const replaced = () =>
		error(
			409,
			'This file has been uploaded and checked already; its content cannot be replaced. Delete it and attach the new file.'
		);
	if (row.status !== 'pending') replaced();
	// A failed upload leaves nothing behind; nothing was stored under the file's key yet.
	const discardPending = () => forgetPendingAttachment(db, row);
	const announced = row.sizeBytes ?? 0;
	const bytes = await readBodyUpTo(body, Math.min(announced, config().ATTACHMENT_MAX_BYTES)).catch(
		() => 'interrupted' as const
	);
	if (bytes === 'interrupted') {
		await discardPending();
		error(400, 'The upload was interrupted; the file was not kept. Try again.');
	}
	if (!bytes || bytes.length !== announced) {
		await discardPending();
		error(400, 'The file does not have the announced size; it was not kept.');
	}
	const sniffed = sniffFile(row.fileName, bytes.subarray(0, 4100), await fileTypeFromBuffer(bytes));
	if (!sniffed.ok) {
		await discardPending();
		error(415, `Refused: ${sniffed.reason}.`);
	}
	const thumbnail = sniffed.isImage ? await thumbnailOf(bytes) : null;
	const objectKey = newObjectKey(row.datasetId, row.fileName);
	const thumbnailKey = thumbnail ? `${objectKey}.thumb.webp` : null;
	try {
		await s3().send(
			new PutObjectCommand({
				Bucket: bucket(),
				Key: objectKey,
				Body: bytes,
				ContentType: sniffed.contentType
			})
		);
		if (thumbnail && thumbnailKey) {
			await s3().send(
				new PutObjectCommand({
					Bucket: bucket(),
					Key: thumbnailKey,
					Body: thumbnail,
					ContentType: 'image/webp'
				})
			);
		}
	} catch (err) {
		console.error('attachment upload: the object store refused or is unreachable', err);
		await discardPending();
		// In the background: a store that is down would hold the answer for the deletes' timeouts too.
		void removeObjects([objectKey, thumbnailKey]);
		error(503, 'The file store could not be reached; the file was not kept. Try again.');
	}
	const updated = await markAttachmentReady(db, viewer, row, {
		objectKey,
		contentType: sniffed.contentType,
		sha256: createHash('sha256').update(bytes).digest('hex'),
		thumbnailKey
	});
	if (!updated) {
		// Another upload finished first, or the file was deleted meanwhile: keep nothing of this one.
		await removeObjects([objectKey, thumbnailKey]);
		return replaced();
	}
	return updated;
}

/**
 * A ready file's bytes (or its thumbnail) with the headers to serve them, after the viewer may
 * see the file's dataset. The type is the one sniffed at upload, never the store's; files are
 * served as downloads and their bytes are checked against the recorded SHA-256 on the way out.
 */
export async function openAttachment(
	db: Db,
	viewer: Viewer,
	id: string,
	variant: 'file' | 'thumbnail'
) {
	const row = await readyAttachmentForViewer(db, viewer, id);
	const key = variant === 'thumbnail' ? row.thumbnailKey : row.objectKey;
	if (!key) notFound();
	const stored = await s3()
		.send(new GetObjectCommand({ Bucket: bucket(), Key: key }))
		.catch((err) => {
			console.error(`attachment ${id}: reading ${variant} from the object store failed`, err);
			error(503, 'The file store could not be reached; try again.');
		});
	if (!stored.Body) error(503, 'The file store returned no content; try again.');
	const raw = stored.Body.transformToWebStream();
	const disposition = `${variant === 'thumbnail' ? 'inline' : 'attachment'}; filename*=UTF-8''${encodeURIComponent(row.fileName)}`;
	const headers: Record<string, string> = {
		'content-type':
			variant === 'thumbnail' ? 'image/webp' : (row.contentType ?? 'application/octet-stream'),
		'content-disposition': disposition,
		'x-content-type-options': 'nosniff',
		// Opened directly, a file runs nothing and loads nothing.
		'content-security-policy': "default-src 'none'; sandbox",
		'cache-control': 'private, no-store'
	};
	if (variant === 'thumbnail' || !row.sha256 || row.sizeBytes === null) {
		if (stored.ContentLength !== undefined)
			headers['content-length'] = String(stored.ContentLength);
		return { body: raw, headers };
	}
	headers['content-length'] = String(row.sizeBytes);
	const body = checkedStream(raw, { sha256: row.sha256, sizeBytes: row.sizeBytes }, () =>
		console.error(
			`attachment ${id}: the stored object differs from the checked file (SHA-256); download stopped`
		)
	);
	return { body, headers };
}

export async function deleteAttachment(db: Db, viewer: Viewer, id: string) {
	const row = await attachmentForChange(db, viewer, id, 'delete');
	await discard(db, row);
}

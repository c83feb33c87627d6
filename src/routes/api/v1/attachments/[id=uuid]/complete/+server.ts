import { json } from '@sveltejs/kit';
import { completeAttachmentUpload } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import type { RequestHandler } from './$types';

/** After the browser's PUT: verify, sniff, hash and thumbnail the file. */
export const POST: RequestHandler = async (event) => {
	requireUser(event, 'action');
	const row = await completeAttachmentUpload(getDb(), event.locals.viewer, event.params.id);
	return json({
		id: row.id,
		fileName: row.fileName,
		contentType: row.contentType,
		sizeBytes: row.sizeBytes,
		sha256: row.sha256,
		hasThumbnail: Boolean(row.thumbnailKey)
	});
};

import { apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { receiveAttachmentContent } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import type { RequestHandler } from './$types';

/**
 * The bytes of an announced file, sent by the browser to the app's own origin: checked (size,
 * type sniffed from the bytes, SHA-256, thumbnail) and stored in one step. Refused once the file
 * is ready, so a checked file can never be swapped.
 */
export const PUT: RequestHandler = apiHandler(async (event) => {
	requireUser(event, 'action');
	const row = await receiveAttachmentContent(
		getDb(),
		event.locals.viewer,
		event.params.id,
		event.request.body
	);
	return json({
		id: row.id,
		fileName: row.fileName,
		contentType: row.contentType,
		sizeBytes: row.sizeBytes,
		sha256: row.sha256,
		hasThumbnail: Boolean(row.thumbnailKey)
	});
});

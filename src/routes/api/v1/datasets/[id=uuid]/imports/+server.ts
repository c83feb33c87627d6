import { apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { parseBody, requireUser } from '$lib/server/guards';
import { requireUploadRight, startImport } from '$lib/server/imports/batches';
import { startImportSchema } from '$lib/schemas/imports';
import type { RequestHandler } from './$types';

/**
 * Start an import from a file uploaded to the dataset (POST /api/v1/attachments, then its
 * content): the server parses it and answers with its columns and a suggested mapping. Nothing
 * is written to the dataset's sites until the batch is committed.
 */
export const POST: RequestHandler = apiHandler(async (event) => {
	requireUser(event, 'action');
	// The right first, so a hidden dataset is a 404 whatever the body.
	await requireUploadRight(getDb(), event.locals.viewer, event.params.id);
	const body = await parseBody(event, startImportSchema);
	return json(await startImport(getDb(), event.locals.viewer, event.params.id, body.attachmentId), {
		status: 201
	});
});

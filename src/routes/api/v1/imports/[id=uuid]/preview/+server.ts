import { apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { parseBody, requireUser } from '$lib/server/guards';
import { batchForChange, previewImport } from '$lib/server/imports/batches';
import { limitUser } from '$lib/server/rate-limit';
import { previewRequestSchema } from '$lib/schemas/imports';
import type { RequestHandler } from './$types';

/** Check a draft import with a mapping, settings, corrections and exclusions; writes no sites. */
export const POST: RequestHandler = apiHandler(async (event) => {
	// Counted before the body is read: the limit is about the work a preview costs.
	await limitUser(getDb(), event, requireUser(event, 'action').id, 'import-preview');
	const batch = await batchForChange(getDb(), event.locals.viewer, event.params.id);
	const { edits, ...settings } = await parseBody(event, previewRequestSchema);
	return json(await previewImport(getDb(), event.locals.viewer, batch, settings, edits));
});

import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { requireUploader } from '$lib/server/guards';
import { startImport } from '$lib/server/imports/run-import';
import type { RequestHandler } from './$types';

/** Start an atomic import of every row (refused with 400 if any row has an error); poll /api/v1/imports/{batchId}. */
export const POST: RequestHandler = async (event) => {
	const { payload } = await requireUploader(event, event.params.id);
	return json(await startImport(getDb(), event.locals.viewer, event.params.id, payload), {
		status: 202
	});
};

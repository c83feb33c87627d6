import { error, json } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { importBatch } from '$lib/server/db/schema';
import { requireUser } from '$lib/server/guards';
import { datasetForViewer } from '$lib/server/repositories/dataset-access';
import type { RequestHandler } from './$types';

/** Progress of an import: rows written so far, and its final state. */
export const GET: RequestHandler = async (event) => {
	requireUser(event, 'action');
	if (!/^[0-9a-f-]{36}$/i.test(event.params.id)) error(404, 'No such import.');
	const db = getDb();
	const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, event.params.id));
	if (!batch) error(404, 'No such import.');
	const found = await datasetForViewer(db, event.locals.viewer, batch.datasetId);
	if (!found.can.readPrivate) error(404, 'No such import.');
	return json(
		{
			id: batch.id,
			status: batch.status,
			totalRows: batch.totalRows,
			doneRows: batch.doneRows,
			error: batch.error,
			datasetId: batch.datasetId
		},
		{ headers: { 'cache-control': 'no-store' } }
	);
};

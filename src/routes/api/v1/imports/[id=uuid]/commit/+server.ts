import { apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { config } from '$lib/server/config';
import { getDb } from '$lib/server/db';
import { parseBody, requireUser } from '$lib/server/guards';
import { batchForChange, commitImport } from '$lib/server/imports/batches';
import { jobs } from '$lib/server/jobs/boss';
import { enqueueImport } from '$lib/server/jobs/import-queue';
import { commitRequestSchema } from '$lib/schemas/imports';
import type { RequestHandler } from './$types';

/** Import the previewed rows of a draft (all or none, on the job queue); poll /api/v1/imports/{id}. */
export const POST: RequestHandler = apiHandler(async (event) => {
	requireUser(event, 'action');
	const batch = await batchForChange(getDb(), event.locals.viewer, event.params.id);
	const body = await parseBody(event, commitRequestSchema);
	const started = await commitImport(getDb(), batch, body, async (id) =>
		enqueueImport(await jobs(config().DATABASE_URL), id)
	);
	return json(started, { status: 202 });
});

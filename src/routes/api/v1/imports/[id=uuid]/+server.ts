import { apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { importForViewer } from '$lib/server/repositories/datasets';
import type { RequestHandler } from './$types';

/** Progress of an import: rows written so far, and its final state. */
export const GET: RequestHandler = apiHandler(async (event) => {
	requireUser(event, 'action');
	const batch = await importForViewer(getDb(), event.locals.viewer, event.params.id);
	return json(batch, { headers: { 'cache-control': 'no-store' } });
});

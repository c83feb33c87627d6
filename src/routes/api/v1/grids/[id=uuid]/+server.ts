import { apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { gridStatus } from '$lib/server/grids/service';
import type { RequestHandler } from './$types';

/** A grid's status, progress, CRS, variogram, cross-validation and download links. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const status = await gridStatus(getDb(), event.locals.viewer, event.params.id);
	return json(status, { headers: { 'cache-control': 'no-store' } });
});

import { apiHandler } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { regionQuery } from '$lib/server/region-query';
import { regionDownload } from '$lib/server/repositories/region-download';
import type { RequestHandler } from './$types';

/**
 * The visible sites of a map region (`bbox` or `polygon`) matching the map's filters as
 * CSV, with the citation and licence of every dataset they come from (region-download.ts).
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const { region, filters } = await regionQuery(url.searchParams, locals.viewer);
	const d = await regionDownload(getDb(), locals.viewer, region, filters, 'csv', url.origin);
	return new Response(d.body, { headers: d.headers });
});

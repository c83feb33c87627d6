import { apiHandler } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { mapQuery } from '$lib/server/map-query';
import { privateJson } from '$lib/server/private-json';
import { regionStatistics } from '$lib/server/repositories/map';
import type { RequestHandler } from './$types';

/**
 * Heat-flow statistics of the visible sites matching the filters inside `bbox` (the rectangle
 * drawn on the map). Downloading those sites with their citations belongs to the dataset
 * downloads; the region panel links there with the same bbox and filters.
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals, request }) => {
	const { box, filters } = mapQuery(url.searchParams);
	return privateJson(request, await regionStatistics(getDb(), locals.viewer, box, filters));
});

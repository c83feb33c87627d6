import { apiHandler } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { privateJson } from '$lib/server/private-json';
import { polygonBodyQuery, regionQuery } from '$lib/server/region-query';
import { regionStatistics } from '$lib/server/repositories/map';
import type { RequestHandler } from './$types';

/**
 * Heat-flow statistics of the visible sites matching the filters inside a region: GET with
 * `bbox` (the rectangle) or `polygon=lon lat,…`; POST with a GeoJSON Polygon as the body (a drawn
 * polygon, limits in `$lib/map/region-shape.ts`). The sites themselves with their citations are
 * `region/sites.csv` and `region/sites.geojson`.
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals, request }) => {
	const { region, filters } = await regionQuery(url.searchParams, locals.viewer);
	return privateJson(request, await regionStatistics(getDb(), locals.viewer, region, filters));
});

export const POST: RequestHandler = apiHandler(async ({ url, locals, request }) => {
	const { region, filters } = await polygonBodyQuery(request, url.searchParams);
	return privateJson(request, await regionStatistics(getDb(), locals.viewer, region, filters), 0);
});

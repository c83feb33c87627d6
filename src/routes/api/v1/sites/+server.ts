import { sitesQuery } from '$lib/api/schemas';
import { parseBBox } from '$lib/geo/bbox';
import { parseSiteFilters } from '$lib/sites/filters';
import {
	ApiFailure,
	apiHandler,
	encodeCursor,
	jsonAnswer,
	parseQuery,
	uuidCursor
} from '$lib/server/api/http';
import { presentSite, siteFeature } from '$lib/server/api/presenters';
import { getDb } from '$lib/server/db';
import { sitesPage } from '$lib/server/repositories/api';
import type { RequestHandler } from './$types';

/**
 * The sites the caller sees on the map, a page at a time, as a GeoJSON FeatureCollection
 * (default) or JSON. The filters are the map's ($lib/sites/filters.ts), read from the same
 * parameters; `sort` and `order` give a stable order for the keyset cursor.
 */
export const GET: RequestHandler = apiHandler(async ({ url, request, locals }) => {
	const q = parseQuery(sitesQuery, url);
	const bbox = q.bbox === undefined ? null : parseBBox(q.bbox);
	if (bbox && !bbox.ok)
		throw new ApiFailure(400, 'invalid_parameter', bbox.error, { parameter: 'bbox' });
	const result = await sitesPage(
		getDb(),
		locals.viewer,
		{
			filters: parseSiteFilters(url.searchParams),
			bbox: bbox?.value ?? null,
			datasetId: q.dataset,
			sort: q.sort
		},
		{ after: uuidCursor(q.cursor), limit: q.limit, descending: q.order === 'desc' }
	);
	const next = encodeCursor(result.next);
	if (q.f === 'json')
		return jsonAnswer(request, { items: result.items.map(presentSite), next, limit: q.limit });
	return jsonAnswer(
		request,
		{ type: 'FeatureCollection', features: result.items.map(siteFeature), next, limit: q.limit },
		true
	);
});

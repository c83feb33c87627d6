import { siteQuery } from '$lib/api/schemas';
import { apiHandler, jsonAnswer, parseQuery } from '$lib/server/api/http';
import { presentSite, siteFeature } from '$lib/server/api/presenters';
import { getDb } from '$lib/server/db';
import { siteById } from '$lib/server/repositories/api';
import type { RequestHandler } from './$types';

/** One site the caller may see (as its page), as JSON or a GeoJSON Feature. */
export const GET: RequestHandler = apiHandler(async ({ url, request, locals, params }) => {
	const q = parseQuery(siteQuery, url);
	const row = await siteById(getDb(), locals.viewer, params.id);
	return q.f === 'geojson'
		? jsonAnswer(request, siteFeature(row), true)
		: jsonAnswer(request, presentSite(row));
});

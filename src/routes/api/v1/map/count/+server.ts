import { apiHandler } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { mapQuery } from '$lib/server/map-query';
import { privateJson } from '$lib/server/private-json';
import { countMatchingSites } from '$lib/server/repositories/map';
import type { RequestHandler } from './$types';

/** How many sites the caller may see match the filters, anywhere (the filter panel's count). */
export const GET: RequestHandler = apiHandler(async ({ url, locals, request }) => {
	const { filters } = mapQuery(url.searchParams, false);
	return privateJson(request, { count: await countMatchingSites(getDb(), locals.viewer, filters) });
});

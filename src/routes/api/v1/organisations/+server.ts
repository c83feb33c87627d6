import { organisationsQuery } from '$lib/api/schemas';
import {
	apiHandler,
	decodeCursor,
	encodeCursor,
	jsonAnswer,
	parseQuery
} from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { organisationsPage } from '$lib/server/repositories/api';
import type { RequestHandler } from './$types';

/** The public directory of organisations, by id, a page at a time. */
export const GET: RequestHandler = apiHandler(async ({ url, request }) => {
	const q = parseQuery(organisationsQuery, url);
	const result = await organisationsPage(getDb(), {
		after: decodeCursor(q.cursor),
		limit: q.limit
	});
	return jsonAnswer(request, {
		items: result.items,
		next: encodeCursor(result.next),
		limit: q.limit
	});
});

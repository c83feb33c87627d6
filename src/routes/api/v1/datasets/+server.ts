import { datasetsQuery } from '$lib/api/schemas';
import { apiHandler, encodeCursor, jsonAnswer, parseQuery, uuidCursor } from '$lib/server/api/http';
import { presentDataset } from '$lib/server/api/presenters';
import { getDb } from '$lib/server/db';
import { datasetsPage } from '$lib/server/repositories/api';
import type { RequestHandler } from './$types';

/** The datasets the caller may open (as on /datasets), with their citation, by id. */
export const GET: RequestHandler = apiHandler(async ({ url, request, locals }) => {
	const q = parseQuery(datasetsQuery, url);
	const result = await datasetsPage(
		getDb(),
		locals.viewer,
		{ after: uuidCursor(q.cursor), limit: q.limit },
		q.organisation
	);
	return jsonAnswer(request, {
		items: result.items.map((d) => presentDataset(d, url.origin)),
		next: encodeCursor(result.next),
		limit: q.limit
	});
});

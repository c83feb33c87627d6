import { apiHandler } from '$lib/server/api/http';
import { error } from '@sveltejs/kit';
import { MAX_SEARCH_LENGTH } from '$lib/sites/filters';
import { getDb } from '$lib/server/db';
import { privateJson } from '$lib/server/private-json';
import { searchVisibleSites } from '$lib/server/repositories/map';
import type { RequestHandler } from './$types';

// eslint-disable-next-line no-control-regex -- refusing control characters is the point
const CONTROL = /[\u0000-\u001f\u007f]/;

/** Visible sites whose code or name starts with `q` (case-insensitive), at most 10. */
export const GET: RequestHandler = apiHandler(async ({ url, locals, request }) => {
	const q = (url.searchParams.get('q') ?? '').trim();
	if (q.length < 1) error(400, 'q is required: the start of a site code or name');
	if (q.length > MAX_SEARCH_LENGTH) error(400, `q is longer than ${MAX_SEARCH_LENGTH} characters`);
	if (CONTROL.test(q)) error(400, 'q contains control characters');
	return privateJson(request, { sites: await searchVisibleSites(getDb(), locals.viewer, q) });
});

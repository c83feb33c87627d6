import { ApiFailure, apiHandler } from '$lib/server/api/http';
import { json } from '@sveltejs/kit';
import { clientAddress } from '$lib/server/auth/client-address';
import { config } from '$lib/server/config';
import { getDb } from '$lib/server/db';
import { gridRequestFromBody, requestGrid } from '$lib/server/grids/service';
import { jobs } from '$lib/server/jobs/boss';
import type { RequestHandler } from './$types';

/**
 * Request a heat-flow grid of the sites the caller may see (JSON body: $lib/grids/request.ts;
 * `region` names a saved region of the caller's, taken as its polygon).
 * 202 with the grid's id and its status address in Location; an identical request over the same
 * visible data answers with the grid already made or in progress.
 */
export const POST: RequestHandler = apiHandler(async (event) => {
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		throw new ApiFailure(400, 'invalid_json', 'Bad grid request: the body must be JSON.');
	}
	const req = await gridRequestFromBody(getDb(), event.locals.viewer, body);
	const boss = await jobs(config().DATABASE_URL);
	const caller = event.locals.viewer.userId ?? `address|${clientAddress(event.request)}`;
	const found = await requestGrid(getDb(), boss, event.locals.viewer, req, caller);
	if ('refused' in found)
		throw new ApiFailure(
			429,
			'rate_limited',
			`Too many new grids; try again in ${found.retryAfterS} s.`,
			{ retryAfterS: found.retryAfterS }
		);
	const { id, cached } = found;
	const location = `/api/v1/grids/${id}`;
	return json({ id, cached, location }, { status: 202, headers: { location } });
});

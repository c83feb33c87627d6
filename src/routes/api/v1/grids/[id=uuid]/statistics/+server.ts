import { error, json } from '@sveltejs/kit';
import { apiHandler } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { gridRegionStatisticsFor } from '$lib/server/grids/service';
import type { RequestHandler } from './$types';

/**
 * Area-weighted mean and P10/P50/P90 of a finished grid's heat flow and isotherm depth inside a
 * region: POST JSON `{ "bbox": [w, s, e, n] }`, `{ "polygon": [[lon, lat], …] }` or
 * `{ "region": "<saved region id>" }` (optional `temperatureC`), or GET `?bbox=w,s,e,n` or
 * `?region=<id>` with `&temperatureC=`. Same access as the grid; a saved region as on the map.
 */
const answer = async (event: Parameters<RequestHandler>[0], body: unknown) =>
	json(await gridRegionStatisticsFor(getDb(), event.locals.viewer, event.params.id, body), {
		headers: { 'cache-control': 'private, no-store' }
	});

export const POST: RequestHandler = apiHandler(async (event) => {
	let body: unknown;
	try {
		body = await event.request.json();
	} catch {
		error(400, 'Bad region: the body must be JSON.');
	}
	return answer(event, body);
});

export const GET: RequestHandler = apiHandler(async (event) => {
	const q = event.url.searchParams;
	const bbox = q.get('bbox');
	const t = q.get('temperatureC');
	const region = q.get('region');
	const body: Record<string, unknown> = {};
	if (region !== null) body.region = region;
	// Numbers that do not parse stay NaN, which the schema refuses with a sentence.
	if (bbox !== null) body.bbox = bbox.split(',').map((v) => (v.trim() === '' ? NaN : Number(v)));
	if (t !== null && t !== '') body.temperatureC = Number(t);
	return answer(event, body);
});

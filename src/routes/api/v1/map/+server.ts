import { apiHandler } from '$lib/server/api/http';
import { error } from '@sveltejs/kit';
import { parseZoom } from '$lib/map/grid';
import { getDb } from '$lib/server/db';
import { mapQuery } from '$lib/server/map-query';
import { privateJson } from '$lib/server/private-json';
import { mapData } from '$lib/server/repositories/map';
import type { RequestHandler } from './$types';

/**
 * The map's data for one view: `bbox`, `zoom` and the site filters. Grid cells (count and
 * heat-flow statistics of the visible sites) at low zoom, single sites at high zoom; see
 * DEVELOPERS.md "The map at scale".
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals, request }) => {
	const zoom = parseZoom(url.searchParams.get('zoom'));
	if (!zoom.ok) error(400, zoom.error);
	const { box, filters } = mapQuery(url.searchParams);
	return privateJson(request, await mapData(getDb(), locals.viewer, box, zoom.value, filters));
});

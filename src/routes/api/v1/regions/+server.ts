import { json } from '@sveltejs/kit';
import { newSavedRegionSchema } from '$lib/map/saved-region';
import { apiHandler, parseJsonBody } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import {
	createSavedRegion,
	listSavedRegions,
	regionSharingOptions
} from '$lib/server/repositories/saved-regions';
import type { RequestHandler } from './$types';

/**
 * The caller's saved map regions and those shared with their organisations, with the
 * organisations they may share with (GET), or a new one
 * (POST: name, GeoJSON Polygon, optional organisationId). Use one with `region=<id>` wherever
 * the map takes a region (statistics, downloads).
 */
export const GET: RequestHandler = apiHandler(async ({ locals }) =>
	json(
		{
			items: await listSavedRegions(getDb(), locals.viewer),
			shareWith: await regionSharingOptions(getDb(), locals.viewer)
		},
		{ headers: { 'cache-control': 'private, no-store' } }
	)
);

export const POST: RequestHandler = apiHandler(async ({ locals, request }) => {
	const input = await parseJsonBody(newSavedRegionSchema, request);
	const saved = await createSavedRegion(getDb(), locals.viewer, input);
	const location = `/api/v1/regions/${saved.id}`;
	return json(saved, { status: 201, headers: { location } });
});

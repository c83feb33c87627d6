import { json } from '@sveltejs/kit';
import { savedRegionChangeSchema } from '$lib/map/saved-region';
import { apiHandler, parseJsonBody } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import {
	changeSavedRegion,
	deleteSavedRegion,
	getSavedRegion
} from '$lib/server/repositories/saved-regions';
import type { RequestHandler } from './$types';

/** One saved region: read it, rename or (un)share it, delete it (its owner only). */
export const GET: RequestHandler = apiHandler(async ({ locals, params }) =>
	json(await getSavedRegion(getDb(), locals.viewer, params.id), {
		headers: { 'cache-control': 'private, no-store' }
	})
);

export const PATCH: RequestHandler = apiHandler(async ({ locals, params, request }) => {
	const change = await parseJsonBody(savedRegionChangeSchema, request);
	return json(await changeSavedRegion(getDb(), locals.viewer, params.id, change));
});

export const DELETE: RequestHandler = apiHandler(async ({ locals, params }) => {
	await deleteSavedRegion(getDb(), locals.viewer, params.id);
	return new Response(null, { status: 204 });
});

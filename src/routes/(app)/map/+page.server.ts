import { env } from '$env/dynamic/public';
import { getDb } from '$lib/server/db';
import { mapFilterOptions } from '$lib/server/repositories/map';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	// An online tile layer is optional; the offline Natural Earth basemap always works.
	tileUrl: env.PUBLIC_TILE_URL || null,
	tileAttribution: env.PUBLIC_TILE_ATTRIBUTION ?? '',
	// The filter lists: only organisations and datasets the viewer has on maps.
	filterOptions: await mapFilterOptions(getDb(), locals.viewer)
});

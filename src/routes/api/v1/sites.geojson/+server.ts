import { apiHandler } from '$lib/server/api/http';
import { error } from '@sveltejs/kit';
import { parseBBox } from '$lib/geo/bbox';
import { parseSiteFilters } from '$lib/sites/filters';
import { getDb } from '$lib/server/db';
import { visibleSitesInBox } from '$lib/server/repositories/sites';
import type { RequestHandler } from './$types';

/**
 * The sites the caller may see in `bbox` (west,south,east,north, WGS 84) as a GeoJSON
 * FeatureCollection, optionally filtered by quality, method and heat-flow range.
 */
export const GET: RequestHandler = apiHandler(async ({ url, locals }) => {
	const bbox = parseBBox(url.searchParams.get('bbox'));
	if (!bbox.ok) error(400, bbox.error);
	const sites = await visibleSitesInBox(
		getDb(),
		locals.viewer,
		bbox.value,
		parseSiteFilters(url.searchParams)
	);
	const body = {
		type: 'FeatureCollection',
		features: sites.map(({ lon, lat, ...properties }) => ({
			type: 'Feature',
			id: properties.id,
			geometry: { type: 'Point', coordinates: [lon, lat] },
			properties
		}))
	};
	return new Response(JSON.stringify(body), {
		headers: {
			'content-type': 'application/geo+json',
			// Visibility depends on who asks: never let a shared cache keep one viewer's answer.
			'cache-control': 'private, max-age=30',
			vary: 'cookie'
		}
	});
});

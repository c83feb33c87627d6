import { error } from '@sveltejs/kit';
import { parseRegionParams, parseRegionPolygon, type Region } from '$lib/map/region-shape';
import type { SiteFilters } from '$lib/sites/filters';
import { strictSiteFilters } from './map-query';

/** A region from the query (`bbox` or `polygon`) with the filters; bad values are a 400. */
export function regionQuery(params: URLSearchParams): { region: Region; filters: SiteFilters } {
	const region = parseRegionParams(params);
	if (!region.ok) error(400, region.error);
	return { region: region.value, filters: strictSiteFilters(params) };
}

/** A polygon region from a POST body (a GeoJSON Polygon), the filters from the query. */
export async function polygonBodyQuery(
	request: Request,
	params: URLSearchParams
): Promise<{ region: Region; filters: SiteFilters }> {
	let body: unknown;
	try {
		body = await request.json();
	} catch {
		error(400, 'the body must be a GeoJSON Polygon (JSON)');
	}
	const ring = parseRegionPolygon(body);
	if (!ring.ok) error(400, ring.error);
	return { region: { kind: 'polygon', ring: ring.value }, filters: strictSiteFilters(params) };
}

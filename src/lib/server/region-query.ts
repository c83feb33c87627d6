import { error } from '@sveltejs/kit';
import { parseRegionParams, parseRegionPolygon, type Region } from '$lib/map/region-shape';
import type { SiteFilters } from '$lib/sites/filters';
import type { Viewer } from './access';
import { getDb } from './db';
import { strictSiteFilters } from './map-query';
import { savedRegionShape } from './repositories/saved-regions';

/**
 * A region from the query (`bbox`, `polygon`, or `region=<id>` of a saved region the viewer may
 * see: otherwise the one 404) with the filters; bad values are a 400.
 */
export async function regionQuery(
	params: URLSearchParams,
	viewer: Viewer
): Promise<{ region: Region; filters: SiteFilters }> {
	const saved = params.get('region');
	if (saved !== null) {
		if (params.get('bbox') || params.get('polygon'))
			error(400, 'give one of region, bbox or polygon, not several');
		const filters = strictSiteFilters(params);
		return { region: await savedRegionShape(getDb(), viewer, saved), filters };
	}
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

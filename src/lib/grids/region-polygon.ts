import { z } from 'zod';

/**
 * A drawn region as a lon/lat ring (WGS 84), shared by the grid request (the region a grid's
 * overlays and downloads are clipped to) and the region statistics.
 */

/** Vertices of a drawn polygon (after densifying a rectangle's edges, if it is one). */
export const MAX_REGION_VERTICES = 2000;

const lonLat = z
	.array(z.number().refine(Number.isFinite, 'coordinates must be finite numbers'))
	.length(2, 'each polygon vertex must be [lon, lat]')
	.refine(
		([lon, lat]) => Math.abs(lon) <= 180 && Math.abs(lat) <= 90,
		'a vertex is outside lon ±180, lat ±90'
	);

export const regionPolygonSchema = z
	.array(lonLat)
	.min(3, 'a polygon needs at least three vertices')
	.max(MAX_REGION_VERTICES, `a polygon may have at most ${MAX_REGION_VERTICES} vertices`);

/** The lon/lat box [west, south, east, north] around a ring. */
export function polygonBounds(
	ring: readonly (readonly number[])[]
): [number, number, number, number] {
	const lons = ring.map((p) => p[0]);
	const lats = ring.map((p) => p[1]);
	return [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)];
}

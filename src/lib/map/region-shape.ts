import { z } from 'zod';
import { parseBBox, type BBox, type ParseResult } from '$lib/geo/bbox';

/**
 * The region of the region tools: a rectangle (`bbox`, as everywhere on the map) or a polygon
 * drawn on the map. One definition for browser and server: the statistics (POST body, GeoJSON
 * Polygon) and the downloads (GET, `polygon=lon lat,lon lat,…` so the link stays a plain link)
 * read it here.
 */

/** Most corners a drawn polygon may have: plenty for a hand-drawn outline, a bounded query. */
export const MAX_POLYGON_VERTICES = 200;

export type Position = [number, number];

export type Region = { kind: 'bbox'; box: BBox } | { kind: 'polygon'; ring: Position[] };

const position = z.tuple([
	z.number().min(-180, 'longitude below -180').max(180, 'longitude above 180'),
	z.number().min(-90, 'latitude below -90').max(90, 'latitude above 90')
]);

/** Twice the signed planar area in square degrees (shoelace); zero for a degenerate ring. */
function doubleArea(ring: readonly Position[]): number {
	let a = 0;
	for (let i = 0; i + 1 < ring.length; i++)
		a += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
	return a;
}

/** A ring closed (last position equal to the first), as GeoJSON requires. */
function closed(ring: Position[]): Position[] {
	const [first, last] = [ring[0], ring[ring.length - 1]];
	return first[0] === last[0] && first[1] === last[1] ? ring : [...ring, first];
}

/**
 * A GeoJSON Polygon (RFC 7946 §3.1.6) with one outer ring and no holes, at most
 * MAX_POLYGON_VERTICES corners and an area; the ring is closed if it was not. Self-intersection
 * is checked by PostGIS (ST_IsValid) on the server, where the geometry is built.
 */
export const regionPolygonSchema = z
	.object({
		type: z.literal('Polygon', { error: 'the region must be a GeoJSON Polygon' }),
		coordinates: z
			.array(z.array(position))
			.length(1, 'the polygon must have exactly one ring (no holes)')
	})
	.transform((p) => closed(p.coordinates[0]))
	.check((ctx) => {
		const ring = ctx.value;
		const corners = ring.length - 1;
		if (corners < 3)
			ctx.issues.push({ code: 'custom', message: 'a polygon needs three corners', input: ring });
		else if (corners > MAX_POLYGON_VERTICES)
			ctx.issues.push({
				code: 'custom',
				message: `a polygon may have at most ${MAX_POLYGON_VERTICES} corners (it has ${corners})`,
				input: ring
			});
		else if (Math.abs(doubleArea(ring)) < 1e-12)
			ctx.issues.push({ code: 'custom', message: 'the polygon has no area', input: ring });
	});

/** The polygon as a query value: `lon lat,lon lat,…` (the closing corner left out). */
export function polygonToParam(ring: readonly Position[]): string {
	const open = closed([...ring]).slice(0, -1);
	return open.map(([x, y]) => `${+x.toFixed(5)} ${+y.toFixed(5)}`).join(',');
}

/** Read `polygon=lon lat,lon lat,…` through the same schema as the POST body. */
export function parsePolygonParam(text: string): ParseResult<Position[]> {
	const coordinates: Position[] = [];
	for (const pair of text.split(',')) {
		const parts = pair.trim().split(/\s+/);
		const [x, y] = parts.map(Number);
		if (parts.length !== 2 || !Number.isFinite(x) || !Number.isFinite(y))
			return { ok: false, error: `polygon corner "${pair.slice(0, 40)}" is not "lon lat"` };
		coordinates.push([x, y]);
	}
	return parseRegionPolygon({ type: 'Polygon', coordinates: [coordinates] });
}

/** A GeoJSON Polygon body, or the first problem in words. */
export function parseRegionPolygon(value: unknown): ParseResult<Position[]> {
	const r = regionPolygonSchema.safeParse(value);
	return r.success ? { ok: true, value: r.data } : { ok: false, error: r.error.issues[0].message };
}

/** The region of a query: `polygon` when given (then no `bbox` with it), otherwise `bbox`. */
export function parseRegionParams(params: URLSearchParams): ParseResult<Region> {
	const polygon = params.get('polygon');
	if (polygon !== null) {
		if (params.get('bbox')) return { ok: false, error: 'give either bbox or polygon, not both' };
		const ring = parsePolygonParam(polygon);
		return ring.ok ? { ok: true, value: { kind: 'polygon', ring: ring.value } } : ring;
	}
	if (!params.get('bbox'))
		return { ok: false, error: 'bbox is required (west,south,east,north in degrees), or polygon' };
	const box = parseBBox(params.get('bbox'));
	return box.ok ? { ok: true, value: { kind: 'bbox', box: box.value } } : box;
}

/** The box around a ring (for the index condition before the exact test). */
export function ringBounds(ring: readonly Position[]): BBox {
	const xs = ring.map((p) => p[0]);
	const ys = ring.map((p) => p[1]);
	return {
		west: Math.min(...xs),
		south: Math.min(...ys),
		east: Math.max(...xs),
		north: Math.max(...ys)
	};
}

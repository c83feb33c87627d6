/**
 * The map's aggregation grid: square cells in Web Mercator (EPSG:3857), CELL_PX screen pixels wide
 * at the zoom asked for, so a cell looks the same size at every zoom. Shared by the server (which
 * groups sites into cells) and the browser (which draws them).
 */
import type { SiteSummary } from '$lib/sites/summary';

/** Web Mercator sphere radius (m), as EPSG:3857 defines it. */
export const MERCATOR_RADIUS_M = 6378137;
/** Web Mercator stops at ±85.0511° so the world is a square. */
export const MERCATOR_MAX_LAT = 85.0511287798;
/** Screen size of one aggregate cell (px). */
export const CELL_PX = 48;
/** Zoom levels the map API accepts (Leaflet's usual range). */
export const MIN_ZOOM = 0;
export const MAX_ZOOM = 22;
/** From this zoom individual sites are sent, when the view holds at most MAX_SITES of them. */
export const SITE_ZOOM = 6;
export const MAX_SITES = 3000;

/** Width of one cell in Web Mercator metres at a zoom (256-px tiles). */
export function cellSizeM(zoom: number): number {
	return ((2 * Math.PI * MERCATOR_RADIUS_M) / 2 ** zoom / 256) * CELL_PX;
}

/** Web Mercator metres of a longitude/latitude (latitude clamped to the square world). */
export function toMercator(lon: number, lat: number): [number, number] {
	const φ = (Math.max(-MERCATOR_MAX_LAT, Math.min(MERCATOR_MAX_LAT, lat)) * Math.PI) / 180;
	return [
		(lon * Math.PI * MERCATOR_RADIUS_M) / 180,
		MERCATOR_RADIUS_M * Math.log(Math.tan(Math.PI / 4 + φ / 2))
	];
}

/** Longitude/latitude of Web Mercator metres. */
export function fromMercator(x: number, y: number): [number, number] {
	return [
		(x / MERCATOR_RADIUS_M) * (180 / Math.PI),
		(2 * Math.atan(Math.exp(y / MERCATOR_RADIUS_M)) - Math.PI / 2) * (180 / Math.PI)
	];
}

/** The south-west and north-east corners (lon, lat) of cell (ix, iy) at a zoom. */
export function cellBounds(
	ix: number,
	iy: number,
	zoom: number
): [[number, number], [number, number]] {
	const size = cellSizeM(zoom);
	return [fromMercator(ix * size, iy * size), fromMercator((ix + 1) * size, (iy + 1) * size)];
}

/** Parse `zoom=`: a whole number in [MIN_ZOOM, MAX_ZOOM], or a message. */
export function parseZoom(
	text: string | null
): { ok: true; value: number } | { ok: false; error: string } {
	if (text === null || text.trim() === '') return { ok: false, error: 'zoom is required (0–22)' };
	const n = Number(text);
	if (!Number.isInteger(n) || n < MIN_ZOOM || n > MAX_ZOOM) {
		return {
			ok: false,
			error: `zoom must be a whole number from ${MIN_ZOOM} to ${MAX_ZOOM}; got "${text.slice(0, 20)}"`
		};
	}
	return { ok: true, value: n };
}

/** One aggregate cell as the map API sends it. */
export interface MapCell {
	ix: number;
	iy: number;
	count: number;
	/**
	 * Heat-flow statistics (mW/m²) of the cell's sites that have a value; null when none has. No
	 * median: an ordered-set aggregate per cell forces a sort of every site in view, while count,
	 * mean, min and max let PostgreSQL hash-aggregate in parallel (DEVELOPERS.md "The map at
	 * scale"). The region statistics give the median of a drawn region.
	 */
	meanMWm2: number | null;
	minMWm2: number | null;
	maxMWm2: number | null;
}

/** The map API's answer: cells at low zoom (or a crowded view), single sites at high zoom. */
export type MapData =
	| { kind: 'cells'; zoom: number; cellPx: number; count: number; cells: MapCell[] }
	| { kind: 'sites'; zoom: number; count: number; sites: SiteSummary[] };

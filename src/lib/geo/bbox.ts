/** A WGS 84 bounding box in degrees (west, south, east, north), as in GeoJSON and OGC API `bbox`. */
export interface BBox {
	west: number;
	south: number;
	east: number;
	north: number;
}

export const WORLD: BBox = { west: -180, south: -90, east: 180, north: 90 };

export type ParseResult<T> = { ok: true; value: T } | { ok: false; error: string };

/**
 * Parse a `bbox=west,south,east,north` query value. Longitudes are clamped to ±180 and
 * latitudes to ±90 (a zoomed-out web map asks for more than the world); a box that crosses the
 * antimeridian (west > east) is refused rather than silently inverted.
 */
export function parseBBox(text: string | null): ParseResult<BBox> {
	if (text === null || text.trim() === '') return { ok: true, value: WORLD };
	const parts = text.split(',').map((p) => p.trim());
	if (parts.length !== 4) {
		return { ok: false, error: `bbox must be four numbers west,south,east,north; got "${text}"` };
	}
	const numbers = parts.map(Number);
	const bad = numbers.findIndex((n, i) => parts[i] === '' || !Number.isFinite(n));
	if (bad >= 0) {
		const names = ['west', 'south', 'east', 'north'];
		return { ok: false, error: `bbox ${names[bad]} is not a number: "${parts[bad]}"` };
	}
	const clamp = (v: number, limit: number) => Math.max(-limit, Math.min(limit, v));
	const [west, south, east, north] = [
		clamp(numbers[0], 180),
		clamp(numbers[1], 90),
		clamp(numbers[2], 180),
		clamp(numbers[3], 90)
	];
	if (west > east)
		return { ok: false, error: 'bbox west is east of east (antimeridian boxes are not supported)' };
	if (south > north) return { ok: false, error: 'bbox south is north of north' };
	return { ok: true, value: { west, south, east, north } };
}

import { describe, expect, it } from 'vitest';
import { cellBounds, cellSizeM, fromMercator, parseZoom, toMercator } from './grid';

// Web Mercator (EPSG:3857) as its definition gives it: sphere radius 6,378,137 m, world
// ±20,037,508.34 m; 256-px tiles (common practice, no source).
describe('the aggregation grid', () => {
	it('maps the corners of the square world to ±20,037,508 m', () => {
		const [x, y] = toMercator(180, 85.0511287798);
		expect(x).toBeCloseTo(20037508.34, 1);
		expect(y).toBeCloseTo(20037508.34, 0);
		const [x0, y0] = toMercator(0, 0);
		expect(x0).toBe(0);
		expect(y0).toBeCloseTo(0, 6);
	});
	it('round-trips longitude and latitude', () => {
		for (const [lon, lat] of [
			[7.8, 58.8],
			[-101.5, 36.8],
			[134.5, -26]
		]) {
			const [x, y] = toMercator(lon, lat);
			const [lon2, lat2] = fromMercator(x, y);
			expect(lon2).toBeCloseTo(lon, 9);
			expect(lat2).toBeCloseTo(lat, 9);
		}
	});
	it('halves the cell size at each zoom, 48 px of a 256-px tile', () => {
		expect(cellSizeM(0)).toBeCloseTo((2 * Math.PI * 6378137 * 48) / 256, 6);
		expect(cellSizeM(5) / cellSizeM(6)).toBeCloseTo(2, 12);
	});
	it('gives each cell the bounds that contain its sites', () => {
		const [x, y] = toMercator(-149.9, 10.2);
		const size = cellSizeM(5);
		const [[w, s], [e, n]] = cellBounds(Math.floor(x / size), Math.floor(y / size), 5);
		expect(w).toBeLessThanOrEqual(-149.9);
		expect(e).toBeGreaterThan(-149.9);
		expect(s).toBeLessThanOrEqual(10.2);
		expect(n).toBeGreaterThan(10.2);
	});
	it('accepts whole zooms 0–22 only, with a message otherwise', () => {
		expect(parseZoom('0')).toEqual({ ok: true, value: 0 });
		expect(parseZoom('22')).toEqual({ ok: true, value: 22 });
		for (const bad of [null, '', '3.5', '-1', '23', 'x', '1e3']) {
			const r = parseZoom(bad);
			expect(r.ok).toBe(false);
			if (!r.ok) expect(r.error).toMatch(/zoom/);
		}
	});
});

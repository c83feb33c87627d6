import { describe, expect, it } from 'vitest';
import {
	MAX_POLYGON_VERTICES,
	parsePolygonParam,
	parseRegionParams,
	parseRegionPolygon,
	polygonToParam,
	ringBounds
} from './region-shape';

// Thermalith's own query conventions; GeoJSON Polygon rules from RFC 7946 §3.1.6.
describe('map regions', () => {
	const square = [
		[0, 0],
		[2, 0],
		[2, 1],
		[0, 1]
	];

	it('close an open ring, and round-trip a polygon through the query', () => {
		const r = parseRegionPolygon({ type: 'Polygon', coordinates: [square] });
		expect(r).toEqual({ ok: true, value: [...square, [0, 0]] });
		const param = polygonToParam(r.ok ? r.value : []);
		expect(param).toBe('0 0,2 0,2 1,0 1');
		expect(parsePolygonParam(param)).toEqual(r);
		expect(ringBounds(r.ok ? r.value : [])).toEqual({ west: 0, south: 0, east: 2, north: 1 });
	});

	it('refuse holes, too few or too many corners, no area and coordinates off the globe', () => {
		const problem = (coordinates: unknown) => {
			const r = parseRegionPolygon({ type: 'Polygon', coordinates });
			return r.ok ? null : r.error;
		};
		expect(problem([square, square])).toContain('no holes');
		expect(
			problem([
				[
					[0, 0],
					[1, 1]
				]
			])
		).toContain('three corners');
		const many = Array.from({ length: MAX_POLYGON_VERTICES + 1 }, (_, i) => [
			Math.cos(i),
			Math.sin(i)
		]);
		expect(problem([many])).toContain(`at most ${MAX_POLYGON_VERTICES}`);
		expect(
			problem([
				[
					[0, 0],
					[1, 1],
					[2, 2]
				]
			])
		).toContain('no area');
		expect(
			problem([
				[
					[0, 0],
					[181, 0],
					[0, 1]
				]
			])
		).toContain('longitude above 180');
		expect(parseRegionPolygon({ type: 'Point', coordinates: [0, 0] })).toMatchObject({
			ok: false
		});
	});

	it('read bbox or polygon from a query, never both', () => {
		expect(parseRegionParams(new URLSearchParams('bbox=0,0,1,1'))).toEqual({
			ok: true,
			value: { kind: 'bbox', box: { west: 0, south: 0, east: 1, north: 1 } }
		});
		expect(parseRegionParams(new URLSearchParams('polygon=0 0,1 0,1 1'))).toMatchObject({
			ok: true,
			value: { kind: 'polygon' }
		});
		expect(parseRegionParams(new URLSearchParams('bbox=0,0,1,1&polygon=0 0,1 0,1 1'))).toEqual({
			ok: false,
			error: 'give either bbox or polygon, not both'
		});
		expect(parseRegionParams(new URLSearchParams(''))).toMatchObject({ ok: false });
		expect(parsePolygonParam('0 0,1,1 1')).toEqual({
			ok: false,
			error: 'polygon corner "1" is not "lon lat"'
		});
	});
});

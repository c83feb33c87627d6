import { describe, expect, it } from 'vitest';
import { parseGeoJson } from './geojson';

const fc = (features: unknown[]) => JSON.stringify({ type: 'FeatureCollection', features });
const point = (coordinates: number[], properties: Record<string, unknown> | null) => ({
	type: 'Feature',
	geometry: { type: 'Point', coordinates },
	properties
});

describe('parseGeoJson (RFC 7946)', () => {
	it('turns properties into columns and coordinates into longitude/latitude', () => {
		const t = parseGeoJson(
			fc([
				point([5.1, 59.2], { code: 'M1', q: 70 }),
				point([5.3, 59.4, -250], { code: 'M2', corrections: ['topographic', 'other'] })
			])
		);
		expect(t.headers).toEqual(['longitude', 'latitude', 'elevation_m', 'code', 'q', 'corrections']);
		expect(t.rows).toEqual([
			[5.1, 59.2, null, 'M1', 70, null],
			[5.3, 59.4, -250, 'M2', null, 'topographic, other']
		]);
		expect(t.sourceRowNumbers).toEqual([1, 2]);
		expect(t.rowKind).toBe('feature');
	});
	it('rejects invalid GeoJSON with the validator message, non-points naming the feature, bad JSON', () => {
		expect(() => parseGeoJson('{"type":"FeatureCollection"}')).toThrow(/not valid GeoJSON/);
		expect(() =>
			parseGeoJson(
				fc([
					point([1, 2], {}),
					{
						type: 'Feature',
						geometry: {
							type: 'LineString',
							coordinates: [
								[0, 0],
								[1, 1]
							]
						},
						properties: {}
					}
				])
			)
		).toThrow(/Feature 2: geometry must be a Point; got LineString/);
		expect(() => parseGeoJson('{oops')).toThrow(/not valid JSON/);
		expect(() => parseGeoJson(JSON.stringify(point([1, 2], {})))).toThrow(
			/Expected a GeoJSON FeatureCollection/
		);
		expect(() => parseGeoJson(fc([point([1, 2], { latitude: 3 })]))).toThrow(/"latitude"/);
	});
});

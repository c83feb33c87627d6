import { describe, expect, it } from 'vitest';
import { siteFeaturePropertiesSchema } from '../../src/lib/sites/summary';
import { testEnv } from './env';

describe('/api/v1/sites.geojson', () => {
	it('returns the demo scenario sites an anonymous visitor may see as GeoJSON', async () => {
		const res = await fetch(`${testEnv.appUrl()}/api/v1/sites.geojson?bbox=3,56,12,61`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/geo+json');
		const body = await res.json();
		expect(body.type).toBe('FeatureCollection');
		// The embargoed demo wells (SKH-*, released six months after seeding) stay hidden.
		const codes: string[] = body.features.map(
			(f: { properties: { code: string } }) => f.properties.code
		);
		expect(codes.some((c) => c.startsWith('KGS-'))).toBe(true);
		expect(codes.some((c) => c.startsWith('WSP-'))).toBe(true);
		expect(codes.some((c) => c.startsWith('SKH-'))).toBe(false);
		const [lon, lat] = body.features[0].geometry.coordinates;
		expect(lon).toBeGreaterThanOrEqual(3);
		expect(lat).toBeLessThanOrEqual(61);
	});

	it('answers a malformed bbox with 400 and a message naming the bad part', async () => {
		const res = await fetch(`${testEnv.appUrl()}/api/v1/sites.geojson?bbox=1,2,three,4`);
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toContain('east is not a number');
	});

	it('answers with the one site summary shape and applies the shared filters', async () => {
		const all = await (
			await fetch(`${testEnv.appUrl()}/api/v1/sites.geojson?bbox=3,56,12,61`)
		).json();
		for (const f of all.features) siteFeaturePropertiesSchema.parse(f.properties);

		// The same parameters the map and the dataset table use (src/lib/sites/filters.ts).
		const filtered = await (
			await fetch(
				`${testEnv.appUrl()}/api/v1/sites.geojson?bbox=3,56,12,61&quality=constrained,indicative&minHeatFlow=60&q=kgs`
			)
		).json();
		const props = filtered.features.map((f: { properties: unknown }) =>
			siteFeaturePropertiesSchema.parse(f.properties)
		);
		const expected = all.features
			.map((f: { properties: unknown }) => siteFeaturePropertiesSchema.parse(f.properties))
			.filter(
				(p: { code: string; qualityClass: string | null; heatFlowMWm2: number | null }) =>
					p.code.toLowerCase().includes('kgs') &&
					(p.qualityClass === 'constrained' || p.qualityClass === 'indicative') &&
					p.heatFlowMWm2 !== null &&
					p.heatFlowMWm2 >= 60
			);
		expect(expected.length).toBeGreaterThan(0);
		expect(expected.length).toBeLessThan(all.features.length);
		expect(props).toEqual(expected);
	});
});

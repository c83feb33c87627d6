import { describe, expect, it } from 'vitest';
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
		expect((await res.json()).message).toContain('east is not a number');
	});
});

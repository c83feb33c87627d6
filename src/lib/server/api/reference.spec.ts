import { describe, expect, it } from 'vitest';
import { buildReference, typeOf } from '$lib/api/reference';
import { openApiDocument } from './openapi';

describe('the API reference page model', () => {
	it('lists every operation of the generated document with its parameters and answers', () => {
		const ref = buildReference(openApiDocument());
		const ops = ref.operations.map((o) => `${o.method} ${o.path}`);
		expect(ops).toContain('GET /api/v1/sites');
		expect(ops).toContain('POST /api/v1/compute/geotherm');
		const sites = ref.operations.find((o) => o.path === '/api/v1/sites')!;
		expect(sites.parameters.map((p) => p.name)).toEqual(
			expect.arrayContaining(['limit', 'cursor', 'bbox', 'quality', 'sort'])
		);
		expect(sites.responses.find((r) => r.status === '200')!.schemas).toEqual([
			'SitePage (application/json)',
			'SiteFeatureCollection (application/geo+json)'
		]);
		expect(ref.operations.find((o) => o.path === '/api/v1/compute/geotherm')!.requestBody).toBe(
			'GeothermRequest'
		);
		const site = ref.schemas.find((s) => s.name === 'Site')!;
		expect(site.fields.find((f) => f.name === 'heatFlowMWm2')).toMatchObject({
			type: 'number or null',
			required: true
		});
	});

	it('writes types briefly', () => {
		expect(typeOf({ type: 'array', items: { $ref: '#/components/schemas/Site' } })).toBe(
			'array of Site'
		);
		expect(typeOf({ type: 'integer', minimum: 1, maximum: 1000 })).toBe('integer ≥ 1, ≤ 1000');
		expect(typeOf({ type: 'string', enum: ['asc', 'desc'] })).toBe('"asc" | "desc"');
	});
});

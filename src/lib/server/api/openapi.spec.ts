import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { openApiDocument } from './openapi';

describe('the generated OpenAPI document', () => {
	it('is a valid OpenAPI 3.1 document', async () => {
		const validator = new Validator();
		const doc = openApiDocument();
		// A plain JSON copy, as a client downloads it.
		const result = await validator.validate(
			JSON.parse(JSON.stringify(doc)) as Record<string, unknown>
		);
		expect(result.errors ?? []).toEqual([]);
		expect(result.valid).toBe(true);
		expect(validator.version).toBe('3.1');
	});

	it('describes every /api/v1 route, with the one error body', () => {
		const doc = openApiDocument();
		expect(Object.keys(doc.paths ?? {}).sort()).toEqual(
			[
				'/attachments',
				'/attachments/{id}',
				'/attachments/{id}/content',
				'/attachments/{id}/download',
				'/attachments/{id}/thumbnail',
				'/compute/geotherm',
				'/compute/heat-flow',
				'/datasets',
				'/datasets/{id}',
				'/datasets/{id}/imports',
				'/grids',
				'/grids/{id}',
				'/grids/{id}/{file}',
				'/grids/{id}/statistics',
				'/imports/{id}',
				'/imports/{id}/commit',
				'/imports/{id}/preview',
				'/map',
				'/map/count',
				'/map/region',
				'/map/region/sites.csv',
				'/map/region/sites.geojson',
				'/map/search',
				'/openapi.json',
				'/organisations',
				'/regions',
				'/regions/{id}',
				'/sites',
				'/sites.geojson',
				'/sites/{id}',
				'/sites/{id}/temperature-logs'
			].sort()
		);
		const error = doc.components?.schemas?.Error as { properties: Record<string, unknown> };
		expect(Object.keys(error.properties)).toEqual(['error']);
	});
});

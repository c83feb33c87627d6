import { z } from 'zod';
import { createDocument, type ZodOpenApiOperationObject } from 'zod-openapi';
import {
	datasetPageSchema,
	datasetSchema,
	datasetsQuery,
	errorSchema,
	geothermRequestSchema,
	geothermResponseSchema,
	heatFlowRequestSchema,
	heatFlowResponseSchema,
	organisationPageSchema,
	organisationsQuery,
	siteFeatureCollectionSchema,
	siteFeatureSchema,
	sitePageSchema,
	siteQuery,
	siteSchema,
	sitesQuery,
	temperatureLogsSchema
} from '$lib/api/schemas';

/**
 * The OpenAPI 3.1 document of /api/v1, generated from the same zod schemas the routes parse
 * with (zod-openapi), so it describes what the routes do; tests/integration/api-contract.spec.ts
 * validates the document and every route's answers against it.
 */

const error = (description: string) => ({
	description,
	content: { 'application/json': { schema: errorSchema } }
});

const COMMON_ERRORS = {
	'401': error('The API key is unknown, revoked or expired.'),
	'429': {
		...error('Too many requests with this key.'),
		headers: {
			'Retry-After': { description: 'Seconds to wait.', schema: { type: 'integer' as const } }
		}
	}
};

const notModified = {
	description: 'Not modified: the If-None-Match tag is current.',
	headers: { ETag: { schema: { type: 'string' as const } } }
};

const etagHeader = {
	ETag: { description: 'Weak validator of the body.', schema: { type: 'string' as const } }
};

function read(
	summary: string,
	schemas: { json?: z.ZodType; geojson?: z.ZodType },
	extra: Partial<ZodOpenApiOperationObject> = {}
): ZodOpenApiOperationObject {
	const content: Record<string, { schema: z.ZodType }> = {};
	if (schemas.json) content['application/json'] = { schema: schemas.json };
	if (schemas.geojson) content['application/geo+json'] = { schema: schemas.geojson };
	return {
		summary,
		...extra,
		responses: {
			'200': { description: 'OK', headers: etagHeader, content },
			'304': notModified,
			'400': error('An unknown, repeated or invalid parameter.'),
			...COMMON_ERRORS,
			...(extra.responses ?? {})
		}
	};
}

function compute(
	summary: string,
	request: z.ZodType,
	response: z.ZodType
): ZodOpenApiOperationObject {
	return {
		summary,
		tags: ['computations'],
		requestBody: { required: true, content: { 'application/json': { schema: request } } },
		responses: {
			'200': { description: 'Computed', content: { 'application/json': { schema: response } } },
			'400': error('Invalid JSON or fields outside their ranges.'),
			'413': error('The body is too large.'),
			'415': error('The body is not application/json.'),
			'422': error('The thermal core refused the input (named in details.field).'),
			...COMMON_ERRORS
		}
	};
}

const idPath = z.object({ id: z.uuid() });
const notFound = { '404': error('Unknown, or not visible to the caller (the same answer).') };

let cached: ReturnType<typeof createDocument> | undefined;

export function openApiDocument() {
	cached ??= createDocument({
		openapi: '3.1.0',
		info: {
			title: 'Thermalith API',
			version: '1.0.0',
			description:
				'Heat-flow organisations, datasets, sites and temperature logs, and computations of the thermal core. Anonymous callers see public data; an API key (account page) sees what its owner sees. Lists are keyset-paged: pass `next` as `cursor`. GIS clients: OGC API – Features at /ogc.'
		},
		servers: [{ url: '/api/v1' }],
		security: [{}, { bearer: [] }, { apiKey: [] }],
		components: {
			securitySchemes: {
				bearer: { type: 'http', scheme: 'bearer', description: 'Authorization: Bearer <key>' },
				apiKey: { type: 'apiKey', in: 'header', name: 'X-API-Key' }
			}
		},
		paths: {
			'/organisations': {
				get: read(
					'Organisations (public directory)',
					{ json: organisationPageSchema },
					{
						tags: ['organisations'],
						requestParams: { query: organisationsQuery }
					}
				)
			},
			'/datasets': {
				get: read(
					'Datasets the caller may open, with citation',
					{ json: datasetPageSchema },
					{
						tags: ['datasets'],
						requestParams: { query: datasetsQuery }
					}
				)
			},
			'/datasets/{id}': {
				get: read(
					'One dataset with its citation',
					{ json: datasetSchema },
					{
						tags: ['datasets'],
						requestParams: { path: idPath },
						responses: notFound
					}
				)
			},
			'/sites': {
				get: read(
					'Sites the caller sees on the map (GeoJSON or JSON), with the map filters',
					{ json: sitePageSchema, geojson: siteFeatureCollectionSchema },
					{ tags: ['sites'], requestParams: { query: sitesQuery } }
				)
			},
			'/sites/{id}': {
				get: read(
					'One site',
					{ json: siteSchema, geojson: siteFeatureSchema },
					{
						tags: ['sites'],
						requestParams: { path: idPath, query: siteQuery },
						responses: notFound
					}
				)
			},
			'/sites/{id}/temperature-logs': {
				get: read(
					'Temperature logs of a site',
					{ json: temperatureLogsSchema },
					{
						tags: ['sites'],
						requestParams: { path: idPath },
						responses: notFound
					}
				)
			},
			'/compute/geotherm': {
				post: compute(
					'Geotherm with its P10–P90 band for a crustal model',
					geothermRequestSchema,
					geothermResponseSchema
				)
			},
			'/compute/heat-flow': {
				post: compute(
					'Heat flow from a temperature log and conductivities',
					heatFlowRequestSchema,
					heatFlowResponseSchema
				)
			}
		}
	});
	return cached;
}

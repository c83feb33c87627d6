import { z } from 'zod';
import { createDocument, type ZodOpenApiOperationObject } from 'zod-openapi';
import { gridRequestSchema } from '$lib/grids/request';
import { regionStatisticsRequestSchema } from '$lib/grids/region-stats';
import { newSavedRegionSchema, savedRegionChangeSchema } from '$lib/map/saved-region';
import {
	batchStatusSchema,
	commitRequestSchema,
	previewRequestSchema,
	previewResponseSchema,
	startImportSchema,
	uploadedTableSchema
} from '$lib/schemas/imports';
import {
	attachmentAnnouncedSchema,
	attachmentSchema,
	attachmentStartSchema,
	datasetPageSchema,
	datasetSchema,
	datasetsQuery,
	errorSchema,
	geothermRequestSchema,
	gridAcceptedSchema,
	gridFilePath,
	gridFileQuery,
	gridStatusSchema,
	importCommittedSchema,
	mapCountQuerySchema,
	mapCountSchema,
	mapDataSchema,
	mapFeatureCollectionSchema,
	mapQuerySchema,
	mapRegionShapeQuerySchema,
	polygonBodySchema,
	gridRegionStatisticsSchema,
	mapSearchQuerySchema,
	regionStatisticsSchema,
	savedRegionListSchema,
	savedRegionSchema,
	siteSearchSchema,
	sitesGeoJsonQuerySchema,
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

const retryAfter = {
	'Retry-After': { description: 'Seconds to wait.', schema: { type: 'integer' as const } }
};

const COMMON_ERRORS = {
	'401': error('The API key is unknown, revoked or expired.'),
	'503': {
		...error('The database or the file store is not reachable; nothing was changed.'),
		headers: retryAfter
	},
	'429': {
		...error('Too many requests with this key.'),
		headers: retryAfter
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

/** Routes of the app's own pages that change data: a session cookie (or a write key) is needed. */
const SIGNED_IN = {
	'401': error('Sign in first, or the API key is unknown, revoked or expired.'),
	'403': error('The caller may not do this here (or the key is read-only).')
};

const json = (schema: z.ZodType) => ({ 'application/json': { schema } });
const BINARY = { schema: { type: 'string' as const, format: 'binary' } };

/** The map's answers: private to the viewer, with an ETag and 304 (server/private-json.ts). */
function mapRead(
	summary: string,
	query: z.ZodObject,
	schema: z.ZodType,
	media = 'application/json'
): ZodOpenApiOperationObject {
	return {
		summary,
		tags: ['map'],
		requestParams: { query },
		responses: {
			'200': { description: 'OK', headers: etagHeader, content: { [media]: { schema } } },
			'304': notModified,
			'400': error('A missing or malformed bbox, zoom or filter (named in the message).'),
			...COMMON_ERRORS
		}
	};
}

/** A region route taking `region=<id>`: a saved region the caller may not use is the one 404. */
function withSavedRegion(op: ZodOpenApiOperationObject): ZodOpenApiOperationObject {
	return {
		...op,
		responses: {
			...op.responses,
			'401': error('region=<id> without signing in (or an unknown, revoked or expired key).'),
			'404': error('region=<id> is unknown or not visible to the caller (the same answer).')
		}
	};
}

/** A change with a JSON body, answered with JSON. */
function change(
	summary: string,
	tags: string[],
	request: z.ZodType | null,
	status: string,
	response: z.ZodType,
	extra: Record<string, unknown> = {}
): ZodOpenApiOperationObject {
	return {
		summary,
		tags,
		...(request ? { requestBody: { required: true, content: json(request) } } : {}),
		responses: {
			[status]: { description: 'Done', content: json(response) },
			'400': error('Invalid JSON or fields outside their ranges.'),
			...SIGNED_IN,
			...notFound,
			'429': COMMON_ERRORS['429'],
			'503': COMMON_ERRORS['503'],
			...extra
		}
	};
}

/** A file: its bytes with the type sniffed when it was stored. */
function download(summary: string, tags: string[]): ZodOpenApiOperationObject {
	return {
		summary,
		tags,
		requestParams: { path: idPath },
		responses: {
			'200': { description: 'The bytes', content: { '*/*': BINARY } },
			...notFound,
			...COMMON_ERRORS
		}
	};
}

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
			'/sites.geojson': {
				get: {
					summary: 'Every visible site in a box, as the map reads them (not paged)',
					tags: ['map'],
					requestParams: { query: sitesGeoJsonQuerySchema },
					responses: {
						'200': {
							description: 'OK',
							content: { 'application/geo+json': { schema: mapFeatureCollectionSchema } }
						},
						'400': error('A missing or malformed bbox.'),
						...COMMON_ERRORS
					}
				}
			},
			'/map': {
				get: mapRead('One map view: aggregate cells or single sites', mapQuerySchema, mapDataSchema)
			},
			'/map/count': {
				get: mapRead(
					'How many visible sites match the filters',
					mapCountQuerySchema,
					mapCountSchema
				)
			},
			'/map/region': {
				get: withSavedRegion(
					mapRead(
						'Heat-flow statistics of the visible sites in a rectangle, polygon or saved region',
						mapRegionShapeQuerySchema,
						regionStatisticsSchema
					)
				),
				post: {
					summary: 'Heat-flow statistics of the visible sites in a drawn polygon',
					tags: ['map'],
					requestParams: { query: mapRegionShapeQuerySchema.omit({ bbox: true, polygon: true }) },
					requestBody: { required: true, content: json(polygonBodySchema) },
					responses: {
						'200': { description: 'OK', content: json(regionStatisticsSchema) },
						'400': error('Not a polygon, too many corners, no area, or bad filters.'),
						...COMMON_ERRORS
					}
				}
			},
			'/map/region/sites.csv': {
				get: withSavedRegion({
					summary:
						'The visible sites of a region as CSV, with a citation block per dataset (logged)',
					tags: ['map'],
					requestParams: { query: mapRegionShapeQuerySchema },
					responses: {
						'200': { description: 'CSV', content: { 'text/csv': { schema: { type: 'string' } } } },
						'400': error('A bad region or filters, or more sites than one file holds.'),
						...COMMON_ERRORS
					}
				})
			},
			'/map/region/sites.geojson': {
				get: withSavedRegion({
					summary:
						'The visible sites of a region as GeoJSON, citations in metadata.datasets (logged)',
					tags: ['map'],
					requestParams: { query: mapRegionShapeQuerySchema },
					responses: {
						'200': {
							description: 'GeoJSON',
							content: {
								'application/geo+json': {
									schema: {
										type: 'object',
										description: 'RFC 7946 FeatureCollection with metadata.'
									}
								}
							}
						},
						'400': error('A bad region or filters, or more sites than one file holds.'),
						...COMMON_ERRORS
					}
				})
			},
			'/regions': {
				get: {
					summary: 'Your saved regions and those shared with your organisations',
					tags: ['map'],
					responses: {
						'200': { description: 'OK', content: json(savedRegionListSchema) },
						...SIGNED_IN,
						'429': COMMON_ERRORS['429'],
						'503': COMMON_ERRORS['503']
					}
				},
				post: change(
					'Save a region (a valid polygon; names unique per person)',
					['map'],
					newSavedRegionSchema,
					'201',
					savedRegionSchema,
					{
						'409': error('A region of yours has this name, or you keep the most regions.'),
						'415': error('The body is not application/json.')
					}
				)
			},
			'/regions/{id}': {
				get: {
					summary: 'One saved region',
					tags: ['map'],
					requestParams: { path: idPath },
					responses: {
						'200': { description: 'OK', content: json(savedRegionSchema) },
						...SIGNED_IN,
						...notFound,
						'429': COMMON_ERRORS['429'],
						'503': COMMON_ERRORS['503']
					}
				},
				patch: {
					...change(
						'Rename a region of yours, or share it with one of your organisations',
						['map'],
						savedRegionChangeSchema,
						'200',
						savedRegionSchema,
						{
							'409': error('A region of yours has this name.'),
							'415': error('The body is not application/json.')
						}
					),
					requestParams: { path: idPath }
				},
				delete: {
					summary: 'Delete a region of yours',
					tags: ['map'],
					requestParams: { path: idPath },
					responses: {
						'204': { description: 'Deleted' },
						...SIGNED_IN,
						...notFound,
						'429': COMMON_ERRORS['429'],
						'503': COMMON_ERRORS['503']
					}
				}
			},
			'/map/search': {
				get: mapRead(
					'Visible sites whose code or name starts with q (at most 10)',
					mapSearchQuerySchema,
					siteSearchSchema
				)
			},
			'/grids': {
				post: {
					summary: 'Request a heat-flow grid of the visible sites (kriging or IDW)',
					tags: ['grids'],
					requestBody: { required: true, content: json(gridRequestSchema) },
					responses: {
						'202': {
							description: 'Queued, or the same grid already made or in progress',
							headers: {
								Location: { description: 'The status address.', schema: { type: 'string' } }
							},
							content: json(gridAcceptedSchema)
						},
						'400': error('Not JSON, not a grid request, or too few visible sites.'),
						'403': error('The API key may only read.'),
						...COMMON_ERRORS,
						'429': {
							...error('Too many new grids (per caller) or requests with this key.'),
							headers: COMMON_ERRORS['429'].headers
						}
					}
				}
			},
			'/grids/{id}': {
				get: {
					summary: 'Status of a grid, then its model, cross-validation and download links',
					tags: ['grids'],
					requestParams: { path: idPath },
					responses: {
						'200': { description: 'OK', content: json(gridStatusSchema) },
						...notFound,
						...COMMON_ERRORS
					}
				}
			},
			'/grids/{id}/statistics': {
				get: {
					summary: 'Area-weighted statistics of a finished grid inside a rectangle or saved region',
					tags: ['grids'],
					requestParams: {
						path: idPath,
						query: z.object({
							bbox: z.string().optional().meta({ description: 'west,south,east,north in degrees' }),
							region: z
								.uuid()
								.optional()
								.meta({ description: 'A saved region’s id (instead of bbox).' }),
							temperatureC: z.string().optional().meta({ description: 'Isotherm, default 150.' })
						})
					},
					responses: {
						'200': { description: 'OK', content: json(gridRegionStatisticsSchema) },
						'400': error('A bad region or temperature.'),
						...notFound,
						...COMMON_ERRORS
					}
				},
				post: {
					summary:
						'Area-weighted statistics of a finished grid inside a rectangle, polygon or saved region',
					tags: ['grids'],
					requestParams: { path: idPath },
					requestBody: { required: true, content: json(regionStatisticsRequestSchema) },
					responses: {
						'200': { description: 'OK', content: json(gridRegionStatisticsSchema) },
						'400': error('Not JSON, or a bad region or temperature.'),
						...notFound,
						...COMMON_ERRORS
					}
				}
			},
			'/grids/{id}/{file}': {
				get: {
					summary: 'A file of a finished grid (GeoTIFF, CSV, GeoJSON contours, PNG)',
					tags: ['grids'],
					requestParams: { path: gridFilePath, query: gridFileQuery },
					responses: {
						'200': {
							description: 'The file',
							content: {
								'image/tiff': BINARY,
								'image/png': BINARY,
								'text/csv': { schema: { type: 'string' } },
								'application/geo+json': {
									schema: { type: 'object', description: 'RFC 7946 contour lines.' }
								}
							}
						},
						'400': error(
							'A bad depthM, temperatureC, band (p10/p90 need σ) or crust, or a depth below the crust.'
						),
						'404': error('Unknown grid or file name, not visible, or not finished.'),
						...COMMON_ERRORS
					}
				}
			},
			'/attachments': {
				post: change(
					'Announce a file of a dataset (or one of its sites); PUT its bytes next',
					['files'],
					attachmentStartSchema,
					'201',
					attachmentAnnouncedSchema,
					{ '413': error('The file is over the size limit.') }
				)
			},
			'/attachments/{id}': {
				delete: {
					summary: 'Delete a file',
					tags: ['files'],
					requestParams: { path: idPath },
					responses: {
						'204': { description: 'Deleted' },
						...SIGNED_IN,
						...notFound,
						'429': COMMON_ERRORS['429'],
						'503': COMMON_ERRORS['503']
					}
				}
			},
			'/attachments/{id}/content': {
				put: {
					summary: 'The bytes of an announced file (checked, then stored; once only)',
					tags: ['files'],
					requestParams: { path: idPath },
					requestBody: { required: true, content: { 'application/octet-stream': BINARY } },
					responses: {
						'200': { description: 'Stored and checked', content: json(attachmentSchema) },
						'400': error('The bytes differ from the announced size, or are refused.'),
						...SIGNED_IN,
						...notFound,
						'409': error('The file is stored already and cannot be replaced.'),
						'413': error('The file is over the size limit.'),
						'415': error('A type that is not accepted (an executable).'),
						'429': COMMON_ERRORS['429'],
						'503': COMMON_ERRORS['503']
					}
				}
			},
			'/attachments/{id}/download': {
				get: download('A file, after the same access check as its dataset', ['files']),
				head: download('The headers of a file', ['files'])
			},
			'/attachments/{id}/thumbnail': {
				get: download('The thumbnail of an image file', ['files']),
				head: download('The headers of a thumbnail', ['files'])
			},
			'/datasets/{id}/imports': {
				post: {
					...change(
						'Start an import from an uploaded file: its columns and a suggested mapping',
						['imports'],
						startImportSchema,
						'201',
						uploadedTableSchema
					),
					requestParams: { path: idPath }
				}
			},
			'/imports/{id}': {
				get: {
					summary: 'Progress and final state of an import',
					tags: ['imports'],
					requestParams: { path: idPath },
					responses: {
						'200': { description: 'OK', content: json(batchStatusSchema) },
						...SIGNED_IN,
						...notFound,
						...COMMON_ERRORS
					}
				}
			},
			'/imports/{id}/preview': {
				post: {
					...change(
						'Check a draft import with a mapping, settings and fixes (writes no sites)',
						['imports'],
						previewRequestSchema,
						'200',
						previewResponseSchema,
						{ '409': error('The import is not a draft any more.') }
					),
					requestParams: { path: idPath }
				}
			},
			'/imports/{id}/commit': {
				post: {
					...change(
						'Import the previewed rows (all or none, queued); follow /imports/{id}',
						['imports'],
						commitRequestSchema,
						'202',
						importCommittedSchema,
						{ '409': error('Stale revision, blocked rows, or the file was imported before.') }
					),
					requestParams: { path: idPath }
				}
			},
			'/openapi.json': {
				get: {
					summary: 'This document',
					tags: ['meta'],
					responses: {
						'200': {
							description: 'OpenAPI 3.1',
							headers: etagHeader,
							content: json(
								z.record(z.string(), z.unknown()).meta({ description: 'OpenAPI 3.1 document.' })
							)
						},
						'304': notModified,
						...COMMON_ERRORS
					}
				}
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

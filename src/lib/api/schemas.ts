import { z } from 'zod';
import { HEAT_FLOW_METHODS } from '$lib/sites/methods';
import { QUALITY_CLASSES } from '$lib/sites/quality';
import { siteFeaturePropertiesSchema, siteSummarySchema } from '$lib/sites/summary';
import { crustModelIdSchema } from '$lib/grids/crust-models';
import { GRID_STATUSES } from '$lib/grids/status';

/**
 * The schemas of /api/v1: requests are parsed with them, and the OpenAPI document
 * (src/lib/server/api/openapi.ts) is generated from them, so the document cannot drift from what
 * the routes accept and answer. Shared with the browser (the geotherm panel posts a model).
 */

// ---- common -------------------------------------------------------------------------------

export const errorSchema = z
	.object({
		error: z.object({
			code: z.string().meta({ description: 'Stable word a script can branch on.' }),
			message: z.string().meta({ description: 'For people.' }),
			details: z.record(z.string(), z.unknown()).meta({ description: 'What was wrong.' })
		})
	})
	.meta({ id: 'Error', description: 'The one error body of /api/v1 and /ogc.' });

/** Longest page; a larger `limit` is a 400 (unlike /ogc, where the standard wants it capped). */
export const MAX_PAGE_LIMIT = 1000;
export const DEFAULT_PAGE_LIMIT = 100;

const limit = z.coerce
	.number()
	.int()
	.min(1)
	.max(MAX_PAGE_LIMIT)
	.default(DEFAULT_PAGE_LIMIT)
	.meta({ description: `Items per page, 1 to ${MAX_PAGE_LIMIT}.` });
const cursor = z
	.string()
	.max(400)
	.optional()
	.meta({ description: 'Opaque position from the `next` of the previous page.' });

const pageInfo = {
	next: z
		.string()
		.nullable()
		.meta({ description: 'Cursor of the next page; null on the last page.' }),
	limit: z.number().int()
};

// ---- organisations ------------------------------------------------------------------------

export const organisationSchema = z
	.object({
		id: z.string(),
		name: z.string(),
		slug: z.string(),
		country: z.string().nullable(),
		website: z.string().nullable(),
		description: z.string().nullable()
	})
	.meta({ id: 'Organisation' });

export const organisationsQuery = z.strictObject({ limit, cursor });

export const organisationPageSchema = z
	.object({ items: z.array(organisationSchema), ...pageInfo })
	.meta({ id: 'OrganisationPage' });

// ---- datasets -----------------------------------------------------------------------------

export const datasetSchema = z
	.object({
		id: z.uuid(),
		title: z.string(),
		abstract: z.string(),
		keywords: z.array(z.string()),
		organisationId: z.string(),
		organisationName: z.string(),
		licence: z.string(),
		version: z.number().int(),
		status: z.enum(['draft', 'in_review', 'returned', 'published', 'retired']),
		visibility: z.string(),
		embargoUntil: z.string().nullable(),
		doi: z.string().nullable(),
		citation: z.object({
			text: z.string().meta({ description: 'How to cite the dataset, as its curators wrote it.' }),
			doi: z.string().nullable(),
			url: z.string().meta({ description: 'Address of the dataset page.' })
		}),
		sites: z.number().int(),
		updatedAt: z.string().meta({ format: 'date-time' })
	})
	.meta({ id: 'Dataset' });

export const datasetsQuery = z.strictObject({
	limit,
	cursor,
	organisation: z.string().max(200).optional().meta({ description: 'Organisation id.' })
});

export const datasetPageSchema = z
	.object({ items: z.array(datasetSchema), ...pageInfo })
	.meta({ id: 'DatasetPage' });

// ---- sites --------------------------------------------------------------------------------

export const SITE_SORTS = ['id', 'code'] as const;

export const sitesQuery = z.strictObject({
	limit,
	cursor,
	sort: z.enum(SITE_SORTS).default('id').meta({ description: 'Order of the pages (stable).' }),
	order: z.enum(['asc', 'desc']).default('asc'),
	f: z
		.enum(['geojson', 'json'])
		.default('geojson')
		.meta({ description: 'GeoJSON FeatureCollection (RFC 7946) or plain JSON.' }),
	bbox: z
		.string()
		.optional()
		.meta({ description: 'west,south,east,north in WGS 84 degrees.', example: '5,50,15,60' }),
	dataset: z.uuid().optional().meta({ description: 'Only the sites of this dataset.' }),
	quality: z
		.string()
		.optional()
		.meta({ description: `Comma list of quality classes: ${QUALITY_CLASSES.join(', ')}.` }),
	method: z
		.string()
		.optional()
		.meta({ description: `Comma list of methods: ${HEAT_FLOW_METHODS.join(', ')}.` }),
	minHeatFlow: z.coerce.number().optional().meta({ description: 'mW/m², inclusive.' }),
	maxHeatFlow: z.coerce.number().optional().meta({ description: 'mW/m², inclusive.' }),
	q: z.string().max(100).optional().meta({ description: 'Site code or name contains.' })
});

export const siteSchema = z
	.object({
		id: z.uuid(),
		code: z.string(),
		name: z.string().nullable(),
		lon: z.number(),
		lat: z.number(),
		heatFlowMWm2: z.number().nullable(),
		heatFlowSigmaMWm2: z.number().nullable(),
		method: z.string(),
		qualityClass: z.string().nullable(),
		yearMeasured: z.number().int().nullable(),
		datasetId: z.uuid(),
		datasetTitle: z.string(),
		organisationName: z.string()
	})
	.meta({ id: 'Site' });

const { lon: _lon, lat: _lat, ...siteProperties } = siteSchema.shape;

export const siteFeatureSchema = z
	.object({
		type: z.literal('Feature'),
		id: z.uuid(),
		geometry: z.object({
			type: z.literal('Point'),
			coordinates: z.array(z.number()).min(2).max(2)
		}),
		properties: z.object(siteProperties)
	})
	.meta({ id: 'SiteFeature' });

export const siteFeatureCollectionSchema = z
	.object({
		type: z.literal('FeatureCollection'),
		features: z.array(siteFeatureSchema),
		...pageInfo
	})
	.meta({ id: 'SiteFeatureCollection', description: 'RFC 7946, with `next` and `limit` members.' });

export const sitePageSchema = z
	.object({ items: z.array(siteSchema), ...pageInfo })
	.meta({ id: 'SitePage' });

export const siteQuery = z.strictObject({
	f: z.enum(['geojson', 'json']).default('json')
});

export const temperatureLogSchema = z
	.object({
		id: z.uuid(),
		siteId: z.uuid(),
		name: z.string(),
		depthM: z.array(z.number()),
		temperatureC: z.array(z.number()),
		createdAt: z.string().meta({ format: 'date-time' })
	})
	.meta({ id: 'TemperatureLog' });

export const temperatureLogsSchema = z
	.object({ items: z.array(temperatureLogSchema) })
	.meta({ id: 'TemperatureLogList' });

// ---- computations -------------------------------------------------------------------------

const positive = z.number().positive();
const finite = z.number();

export const crustLayerSchema = z
	.object({
		thicknessM: positive,
		conductivityWmK: positive.meta({ description: 'At 0 °C.' }),
		heatProductionUWm3: z.number().min(0).meta({ description: 'At the top of the layer.' }),
		heatProductionDecayM: positive.optional(),
		conductivityTempCoeffPerK: z.number().min(0).optional(),
		conductivitySigmaWmK: z.number().min(0).optional().meta({ description: '1-σ, for the band.' }),
		heatProductionSigmaUWm3: z
			.number()
			.min(0)
			.optional()
			.meta({ description: '1-σ, for the band.' })
	})
	.meta({ id: 'CrustLayer' });

/** Most Monte Carlo samples one request may ask for (one core for well under a second). */
export const MAX_API_SAMPLES = 5000;

export const geothermRequestSchema = z
	.object({
		surfaceTemperatureC: finite,
		surfaceHeatFlowMWm2: positive.optional(),
		basalHeatFlowMWm2: z.number().min(0).optional(),
		heatFlowSigmaMWm2: z.number().min(0).default(0),
		layers: z.array(crustLayerSchema).min(1).max(20),
		depthStepM: z.number().min(10).max(10_000).default(500),
		samples: z.number().int().min(2).max(MAX_API_SAMPLES).default(1000),
		seed: z.number().int().default(1),
		isothermsC: z.array(finite).max(10).default([])
	})
	.refine((v) => (v.surfaceHeatFlowMWm2 === undefined) !== (v.basalHeatFlowMWm2 === undefined), {
		message: 'Give exactly one of surfaceHeatFlowMWm2 and basalHeatFlowMWm2.',
		path: ['surfaceHeatFlowMWm2']
	})
	.meta({ id: 'GeothermRequest', description: 'A 1-D conductive crustal model.' });

const triple = z.object({ p10: z.number(), p50: z.number(), p90: z.number() });

export const geothermResponseSchema = z
	.object({
		depthM: z.array(z.number()),
		temperatureC: z.array(z.number()).meta({ description: 'Central model.' }),
		heatFlowMWm2: z.array(z.number()),
		band: z.object({
			p10C: z.array(z.number()),
			p50C: z.array(z.number()),
			p90C: z.array(z.number()),
			surfaceHeatFlowMWm2: triple,
			basalHeatFlowMWm2: triple,
			isotherms: z.array(
				z.object({
					temperatureC: z.number(),
					p10M: z.number().nullable(),
					p50M: z.number().nullable(),
					p90M: z.number().nullable(),
					fractionReached: z.number()
				})
			),
			samples: z.number().int(),
			seed: z.number().int()
		}),
		surfaceHeatFlowMWm2: z.number(),
		basalHeatFlowMWm2: z.number(),
		warnings: z.array(z.string()),
		caution: z.string()
	})
	.meta({ id: 'GeothermResponse', description: 'P10 is the cooler (10th percentile) edge.' });

export const heatFlowRequestSchema = z
	.object({
		depthM: z.array(finite).min(3).max(100_000),
		temperatureC: z.array(finite).min(3).max(100_000),
		conductivity: z
			.array(
				z.object({
					topM: finite,
					bottomM: finite,
					conductivityWmK: positive,
					sigmaWmK: z.number().min(0).optional()
				})
			)
			.min(1)
			.max(10_000),
		method: z.enum(['interval', 'bullard']),
		fromM: finite.optional(),
		toM: finite.optional()
	})
	.meta({ id: 'HeatFlowRequest', description: 'A temperature log and conductivities.' });

export const heatFlowResponseSchema = z
	.object({
		heatFlowMWm2: z.number(),
		sigmaMWm2: z.number(),
		gradientKPerKm: z.number(),
		sigmaGradientKPerKm: z.number(),
		meanConductivityWmK: z.number(),
		sigmaMeanConductivityWmK: z
			.number()
			.meta({ description: '1-σ of the mean conductivity from the intervals’ σ (0 without).' }),
		interceptC: z.number(),
		samples: z.number().int()
	})
	.meta({ id: 'HeatFlowResponse' });

export type GeothermRequest = z.input<typeof geothermRequestSchema>;
export type GeothermResponse = z.output<typeof geothermResponseSchema>;

// ---- the map's data (the app's own map reads these; filters as in $lib/sites/filters.ts) -----

/**
 * The map filters as query parameters, for the document: the routes read them with
 * `parseSiteFilters` / `siteFilterProblems` ($lib/sites/filters.ts), which refuse malformed
 * values with a 400; lists are comma-separated or repeated.
 */
const mapFilterParams = {
	quality: z
		.string()
		.optional()
		.meta({ description: `Comma list of quality classes: ${QUALITY_CLASSES.join(', ')}.` }),
	method: z
		.string()
		.optional()
		.meta({ description: `Comma list of methods: ${HEAT_FLOW_METHODS.join(', ')}.` }),
	minHeatFlow: z.string().optional().meta({ description: 'mW/m², inclusive.' }),
	maxHeatFlow: z.string().optional().meta({ description: 'mW/m², inclusive.' }),
	q: z.string().optional().meta({ description: 'Site code or name contains.' }),
	organisation: z.string().optional().meta({ description: 'Comma list of organisation ids.' }),
	dataset: z.string().optional().meta({ description: 'Comma list of dataset ids.' }),
	yearFrom: z.string().optional().meta({ description: 'Measured in or after this year.' }),
	yearTo: z.string().optional().meta({ description: 'Measured in or before this year.' }),
	hasLog: z.string().optional().meta({ description: '1: only sites with a temperature log.' })
};
const bboxParam = z
	.string()
	.meta({ description: 'west,south,east,north in WGS 84 degrees.', example: '5,50,15,60' });

export const mapQuerySchema = z.object({
	bbox: bboxParam,
	zoom: z.string().meta({ description: 'Map zoom level, a whole number.', example: '5' }),
	...mapFilterParams
});
export const mapCountQuerySchema = z.object({ bbox: bboxParam.optional(), ...mapFilterParams });
export const mapRegionQuerySchema = z.object({ bbox: bboxParam, ...mapFilterParams });
/** A region as a rectangle or a polygon (`lon lat,lon lat,…`), one of the two. */
export const mapRegionShapeQuerySchema = z.object({
	bbox: bboxParam.optional(),
	polygon: z
		.string()
		.optional()
		.meta({ description: 'Corners as `lon lat,lon lat,…` (at most 200), instead of bbox.' }),
	region: z
		.uuid()
		.optional()
		.meta({ description: 'Id of a saved region (/regions) instead of bbox or polygon.' }),
	...mapFilterParams
});
/** A drawn polygon as the body of POST /map/region (limits in $lib/map/region-shape.ts). */
export const polygonBodySchema = z
	.object({
		type: z.literal('Polygon'),
		coordinates: z.array(z.array(z.array(z.number()).min(2).max(3)))
	})
	.meta({ id: 'PolygonBody', description: 'A GeoJSON Polygon: one outer ring, no holes.' });

const weightedSummarySchema = z.object({
	coveredAreaM2: z.number(),
	mean: z.number().nullable(),
	p10: z.number().nullable(),
	p50: z.number().nullable(),
	p90: z.number().nullable()
});
/** Area-weighted statistics of a grid inside a region ($lib/grids/region-stats.ts). */
export const gridRegionStatisticsSchema = z
	.object({
		regionAreaM2: z.number(),
		heatFlowMWm2: weightedSummarySchema,
		isothermDepthM: weightedSummarySchema.extend({
			temperatureC: z.number(),
			crust: crustModelIdSchema.meta({ description: 'The crustal model of the depths.' }),
			notReachedAreaM2: z.number()
		})
	})
	.meta({ id: 'GridRegionStatistics' });
export const mapSearchQuerySchema = z.object({
	q: z.string().meta({ description: 'Start of a site code or name (1 to 100 characters).' })
});
export const sitesGeoJsonQuerySchema = mapRegionQuerySchema;

/** A site as the map and the dataset table show it (no dataset id; $lib/sites/summary.ts). */
export const mapSiteSchema = siteSummarySchema.meta({ id: 'MapSite' });

const statistic = z.number().nullable();
export const mapCellSchema = z
	.object({
		ix: z.number().int(),
		iy: z.number().int(),
		count: z.number().int(),
		meanMWm2: statistic,
		minMWm2: statistic,
		maxMWm2: statistic
	})
	.meta({
		id: 'MapCell',
		description:
			'A square of the Web Mercator grid at this zoom: count, mean, minimum and maximum heat flow (no median: see the region statistics).'
	});

export const mapDataSchema = z
	.discriminatedUnion('kind', [
		z.object({
			kind: z.literal('cells'),
			zoom: z.number().int(),
			cellPx: z.number().int(),
			count: z.number().int(),
			cells: z.array(mapCellSchema)
		}),
		z.object({
			kind: z.literal('sites'),
			zoom: z.number().int(),
			count: z.number().int(),
			sites: z.array(mapSiteSchema)
		})
	])
	.meta({ id: 'MapData', description: 'Cells at low zoom or in a crowded view, else sites.' });

export const mapCountSchema = z.object({ count: z.number().int() }).meta({ id: 'MapCount' });

export const regionStatisticsSchema = z
	.object({
		count: z.number().int(),
		withValue: z.number().int(),
		meanMWm2: statistic,
		medianMWm2: statistic,
		stdDevMWm2: statistic,
		p10MWm2: statistic,
		p90MWm2: statistic,
		minMWm2: statistic,
		maxMWm2: statistic,
		histogram: z.array(z.object({ fromMWm2: z.number(), count: z.number().int() })),
		quality: z.array(
			z.object({ qualityClass: z.enum(QUALITY_CLASSES).nullable(), count: z.number().int() })
		)
	})
	.meta({ id: 'RegionStatistics' });

export const siteSearchSchema = z
	.object({
		sites: z.array(
			z.object({
				id: z.uuid(),
				code: z.string(),
				name: z.string().nullable(),
				lon: z.number(),
				lat: z.number()
			})
		)
	})
	.meta({ id: 'SiteSearch' });

export const mapFeatureCollectionSchema = z
	.object({
		type: z.literal('FeatureCollection'),
		features: z.array(
			z.object({
				type: z.literal('Feature'),
				id: z.uuid(),
				geometry: z.object({
					type: z.literal('Point'),
					coordinates: z.array(z.number()).min(2).max(2)
				}),
				properties: siteFeaturePropertiesSchema
			})
		)
	})
	.meta({ id: 'MapFeatureCollection', description: 'RFC 7946; every visible site in the box.' });

// ---- grids (request schema: $lib/grids/request.ts) -----------------------------------------

export const gridAcceptedSchema = z
	.object({
		id: z.uuid(),
		cached: z.boolean().meta({ description: 'True when the same grid was made or is queued.' }),
		location: z.string().meta({ description: 'Address of the status document.' })
	})
	.meta({ id: 'GridAccepted' });

const nullableNumber = z.number().nullable();

export const gridStatusSchema = z
	.object({
		id: z.uuid(),
		status: z.enum(GRID_STATUSES),
		progress: z.number(),
		error: z.string().nullable(),
		request: z
			.record(z.string(), z.unknown())
			.meta({ description: 'The request as checked (defaults filled in).' }),
		crs: z.object({ epsg: z.number().int(), name: z.string() }),
		grid: z.record(z.string(), z.unknown()).meta({ description: 'Origin, cell size and shape.' }),
		boundsWgs84: z.array(z.number()).min(4).max(4),
		sitesUsed: z.number().int(),
		maskedCells: z.number().int().nullable(),
		valueRangeMWm2: z.array(z.number()).nullable(),
		sigmaRangeMWm2: z.array(z.number()).nullable(),
		variogram: z
			.object({
				model: z.enum(['spherical', 'exponential', 'gaussian']),
				nuggetMWm2: z.number(),
				sillMWm2: z.number(),
				rangeM: z.number(),
				source: z.enum(['fitted', 'user', 'default']),
				note: z.string().nullable(),
				meanMeasurementVarianceMWm2: z.number()
			})
			.nullable(),
		measurementError: z.string().nullable(),
		empiricalVariogram: z.array(z.record(z.string(), z.unknown())),
		crossValidation: z
			.object({
				rmseMWm2: z.number(),
				meanErrorMWm2: z.number(),
				meanStandardisedError: nullableNumber,
				rmsStandardisedError: nullableNumber,
				pairs: z.array(z.array(z.number()))
			})
			.nullable(),
		links: z.record(z.string(), z.string().nullable()).nullable(),
		caution: z.string(),
		atDepthAssumptions: z.string(),
		createdAt: z.string().meta({ format: 'date-time' }),
		finishedAt: z.string().nullable().meta({ format: 'date-time' })
	})
	.meta({ id: 'GridStatus', description: 'Progress, then the model and download links.' });

export const GRID_FILE_NAMES = [
	'heat-flow.tif',
	'sigma.tif',
	'grid.csv',
	'contours.geojson',
	'heat-flow.png',
	'sigma.png',
	'temperature-at-depth.tif',
	'isotherm-depth.tif',
	'temperature-at-depth.png',
	'isotherm-depth.png'
] as const;

export const gridFilePath = z.object({ id: z.uuid(), file: z.enum(GRID_FILE_NAMES) });
export const gridFileQuery = z.object({
	depthM: z
		.string()
		.optional()
		.meta({ description: 'temperature-at-depth.tif/.png: depth below the surface, m.' }),
	temperatureC: z.string().optional().meta({ description: 'isotherm-depth.tif/.png: °C.' }),
	band: z.enum(['p10', 'p50', 'p90']).optional().meta({
		description: 'At-depth overlay PNGs: percentile drawn (default p50; p10/p90 kriging only).'
	}),
	crust: crustModelIdSchema.optional().meta({
		description:
			'At-depth files and overlays: the crustal model (default continental; see /help/models).'
	})
});

// ---- attachments and imports (import shapes: $lib/schemas/imports.ts) ----------------------

export const attachmentStartSchema = z
	.object({
		datasetId: z.uuid('datasetId must be a dataset id'),
		siteId: z.uuid().nullish(),
		fileName: z.string().trim().min(1, 'fileName is empty').max(255),
		sizeBytes: z.number().int('sizeBytes must be a whole number of bytes')
	})
	.meta({ id: 'AttachmentStart' });

export const attachmentAnnouncedSchema = z
	.object({
		id: z.uuid(),
		uploadUrl: z.string().meta({ description: 'Path on this origin to PUT the bytes to.' })
	})
	.meta({ id: 'AttachmentAnnounced' });

export const attachmentSchema = z
	.object({
		id: z.uuid(),
		fileName: z.string(),
		contentType: z.string().nullable(),
		sizeBytes: z.number().int(),
		sha256: z.string().nullable(),
		hasThumbnail: z.boolean()
	})
	.meta({ id: 'Attachment' });

export const importCommittedSchema = z
	.object({ batchId: z.uuid(), rows: z.number().int() })
	.meta({ id: 'ImportQueued' });

// ---- saved regions (requests: $lib/map/saved-region.ts) ------------------------------------

export const savedRegionSchema = z
	.object({
		id: z.uuid(),
		name: z.string(),
		geometry: z.object({
			type: z.literal('Polygon'),
			coordinates: z.array(z.array(z.array(z.number()).length(2)))
		}),
		bbox: z
			.array(z.number())
			.length(4)
			.meta({ description: 'west, south, east, north of the outline.' }),
		mine: z.boolean().meta({ description: 'Saved by the caller, who alone may change it.' }),
		organisation: z
			.object({ id: z.string(), name: z.string() })
			.nullable()
			.meta({ description: 'The organisation it is shared with; null: private.' }),
		createdAt: z.string().meta({ format: 'date-time' }),
		updatedAt: z.string().meta({ format: 'date-time' })
	})
	.meta({ id: 'SavedRegion' });

export const savedRegionListSchema = z
	.object({
		items: z.array(savedRegionSchema),
		shareWith: z
			.array(z.object({ id: z.string(), name: z.string() }))
			.meta({ description: 'Organisations of yours a region may be shared with.' })
	})
	.meta({ id: 'SavedRegionList' });

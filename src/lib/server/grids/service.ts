import { error } from '@sveltejs/kit';
import type PgBoss from 'pg-boss';
import type { GridVariogram } from '$lib/grids/compute';
import {
	AT_DEPTH_ASSUMPTIONS,
	DEFAULT_AT_DEPTH_M,
	DEFAULT_ISOTHERM_C,
	isothermDepthGrid,
	temperatureAtDepthGrid
} from '$lib/grids/at-depth';
import { isothermDepthClasses, overlayColour, temperatureClasses } from '$lib/grids/at-depth-scale';
import { clipCells, outsideRegion } from '$lib/grids/clip';
import {
	atDepthAssumptions,
	CRUST_MODELS,
	crustBaseM,
	crustModelIdSchema,
	DEFAULT_CRUST_MODEL,
	type CrustModel
} from '$lib/grids/crust-models';
import { depthBelowCrust, DEPTH_LIMITS_M, ISOTHERM_LIMITS_C } from '$lib/grids/overlays';
import { gridRequestSchema, requestProblem, type GridRequest } from '$lib/grids/request';
import {
	gridRegionStatistics,
	regionStatisticsRequestSchema,
	type RegionStatistics
} from '$lib/grids/region-stats';
import { notFound, type Viewer } from '../access';
import { USER_RATE_RULES } from '../auth/rate-rules';
import { countAttempt } from '../rate-limit';
import type { Db } from '../db/client';
import { enqueueGrid } from '../jobs/grid-queue';
import { savedRegionShape } from '../repositories/saved-regions';
import {
	deleteQueuedGrid,
	findOrCreateGrid,
	gridForViewer,
	gridSources,
	GridRequestError
} from '../repositories/grids';
import { cellsOf, planOf } from './cells';
import { gridGeoTiff } from './geotiff';
import { gridBoundsWgs84, gridContours, gridCsv, gridOverlayPng, sourceLine } from './outputs';

/** Shown with every grid and in its downloads (ModelCaution says the same on pages). */
export const GRID_CAUTION =
	'Model estimate interpolated from the sites shown, assuming a stationary, isotropic field and the stated variogram; not a measurement. For drilling and resource decisions follow your local regulations and rely on a licensed professional.';

/**
 * A body's `region` (a saved region's id) as its polygon, through the saved regions' access rule
 * (another user's region is the one 404); bodies without one are returned as they are.
 */
async function withSavedRegion(db: Db, viewer: Viewer, body: unknown): Promise<unknown> {
	if (typeof body !== 'object' || body === null || !('region' in body)) return body;
	const { region, ...rest } = body as Record<string, unknown>;
	if (region === undefined) return rest;
	if ('polygon' in rest || 'bbox' in rest)
		error(400, 'Bad region: give one of region, bbox or polygon, not several.');
	if (typeof region !== 'string') error(400, 'Bad region: region must be a saved region’s id.');
	const shape = await savedRegionShape(db, viewer, region);
	if (shape.kind !== 'polygon') return { ...rest, bbox: shape.box };
	return { ...rest, polygon: shape.ring };
}

/** Read and check a request body (a saved region taken as its polygon); 400 with a sentence. */
export async function gridRequestFromBody(
	db: Db,
	viewer: Viewer,
	body: unknown
): Promise<GridRequest> {
	return parseGridRequest(await withSavedRegion(db, viewer, body));
}

/** Read and check a request body; 400 with one sentence when it is not a grid request. */
export function parseGridRequest(body: unknown): GridRequest {
	const parsed = gridRequestSchema.safeParse(body);
	if (!parsed.success) error(400, `Bad grid request: ${requestProblem(parsed.error)}.`);
	return parsed.data;
}

/**
 * Find the cached grid for these inputs or queue a new one. `caller` keys the limit on new jobs
 * (USER_RATE_RULES['grid-job']): the user id, or the client address of an anonymous caller.
 */
export async function requestGrid(
	db: Db,
	boss: PgBoss,
	viewer: Viewer,
	req: GridRequest,
	caller: string
): Promise<{ id: string; cached: boolean } | { refused: true; retryAfterS: number }> {
	let found: { id: string; cached: boolean };
	try {
		found = await findOrCreateGrid(db, viewer, req);
	} catch (err) {
		if (err instanceof GridRequestError) error(400, `Bad grid request: ${err.message}.`);
		throw err;
	}
	if (!found.cached) {
		const verdict = await countAttempt(db, `grid|${caller}`, USER_RATE_RULES['grid-job']);
		if (!verdict.allowed) {
			await deleteQueuedGrid(db, found.id);
			return { refused: true, retryAfterS: verdict.retryAfterS };
		}
		try {
			await enqueueGrid(boss, found.id);
		} catch (err) {
			await deleteQueuedGrid(db, found.id);
			throw err;
		}
	}
	return found;
}

export const GRID_FILES = {
	'heat-flow.tif': 'image/tiff',
	'sigma.tif': 'image/tiff',
	'grid.csv': 'text/csv; charset=utf-8',
	'contours.geojson': 'application/geo+json',
	'heat-flow.png': 'image/png',
	'sigma.png': 'image/png',
	'temperature-at-depth.tif': 'image/tiff',
	'isotherm-depth.tif': 'image/tiff',
	'temperature-at-depth.png': 'image/png',
	'isotherm-depth.png': 'image/png'
} as const;
export type GridFile = keyof typeof GRID_FILES;

function variogramView(v: GridVariogram | null) {
	if (!v) return null;
	return {
		model: v.model,
		nuggetMWm2: v.nugget,
		sillMWm2: v.nugget + v.partialSill,
		rangeM: v.rangeM,
		source: v.source,
		note: v.note ?? null,
		meanMeasurementVarianceMWm2: v.meanMeasurementVarianceMWm2
	};
}

/** The status document of `GET /api/v1/grids/{id}`. */
export async function gridStatus(db: Db, viewer: Viewer, id: string) {
	const row = await gridForViewer(db, viewer, id);
	const plan = planOf(row);
	const req = row.request as unknown as GridRequest;
	const result = (row.result ?? {}) as Record<string, unknown>;
	const base = `/api/v1/grids/${row.id}`;
	const done = row.status === 'done';
	const hasSigma = done && row.sigmaCells !== null;
	return {
		id: row.id,
		status: row.status,
		progress: row.progress,
		error: row.error,
		request: req,
		crs: { epsg: plan.crs.epsg, name: plan.crs.name },
		grid: plan.grid,
		boundsWgs84: gridBoundsWgs84(plan),
		sitesUsed: done ? result.sitesUsed : (row.samples as unknown[]).length,
		maskedCells: result.maskedCells ?? null,
		valueRangeMWm2: result.valueRange ?? null,
		sigmaRangeMWm2: result.sigmaRange ?? null,
		variogram: variogramView((result.variogram as GridVariogram | null) ?? null),
		measurementError: result.measurementError ?? null,
		empiricalVariogram: result.empirical ?? [],
		crossValidation: result.crossValidation ?? null,
		links: done
			? {
					geotiff: `${base}/heat-flow.tif`,
					sigmaGeotiff: hasSigma ? `${base}/sigma.tif` : null,
					csv: `${base}/grid.csv`,
					png: `${base}/heat-flow.png`,
					sigmaPng: hasSigma ? `${base}/sigma.png` : null,
					contours: `${base}/contours.geojson`,
					temperatureAtDepth: `${base}/temperature-at-depth.tif?depthM=${DEFAULT_AT_DEPTH_M}`,
					isothermDepth: `${base}/isotherm-depth.tif?temperatureC=${DEFAULT_ISOTHERM_C}`,
					temperatureAtDepthPng: `${base}/temperature-at-depth.png?depthM=${DEFAULT_AT_DEPTH_M}&band=p50`,
					isothermDepthPng: `${base}/isotherm-depth.png?temperatureC=${DEFAULT_ISOTHERM_C}&band=p50`
				}
			: null,
		caution: GRID_CAUTION,
		atDepthAssumptions: AT_DEPTH_ASSUMPTIONS,
		createdAt: row.createdAt,
		finishedAt: row.finishedAt
	};
}

/** A number query parameter within [min, max], or its default; 400 otherwise. */
function numberParam(
	params: URLSearchParams,
	name: string,
	fallback: number,
	min: number,
	max: number
) {
	const raw = params.get(name);
	if (raw === null || raw === '') return fallback;
	const v = Number(raw);
	if (!Number.isFinite(v) || v < min || v > max)
		error(400, `${name} must be a number from ${min} to ${max}; got ${raw.slice(0, 20)}.`);
	return v;
}

/**
 * The percentile band of an at-depth overlay (`band=p10|p50|p90`, default p50). P10 and P90 come
 * from the kriging σ, so an IDW grid has P50 only: 400 with a sentence rather than an empty image.
 */
function percentileBand(params: URLSearchParams, hasSigma: boolean): 'p10' | 'p50' | 'p90' {
	const band = params.get('band') ?? 'p50';
	if (band !== 'p10' && band !== 'p50' && band !== 'p90')
		error(400, `band must be p10, p50 or p90; got ${band.slice(0, 20)}.`);
	if (band !== 'p50' && !hasSigma)
		error(400, 'P10 and P90 need the kriging standard error: this grid has P50 only.');
	return band;
}

/** The crustal model of the at-depth files (`crust=<id>`, default continental); 400 otherwise. */
function crustParam(params: URLSearchParams): CrustModel {
	const raw = params.get('crust');
	if (raw === null || raw === '') return CRUST_MODELS[DEFAULT_CRUST_MODEL];
	const parsed = crustModelIdSchema.safeParse(raw);
	if (!parsed.success) error(400, `${parsed.error.issues[0].message}; got ${raw.slice(0, 20)}.`);
	return CRUST_MODELS[parsed.data];
}

/** The at-depth files' depth, within the limits and the chosen crust. */
function depthParam(params: URLSearchParams, crust: CrustModel): number {
	const depthM = numberParam(
		params,
		'depthM',
		DEFAULT_AT_DEPTH_M,
		DEPTH_LIMITS_M.min,
		DEPTH_LIMITS_M.max
	);
	if (depthM > crustBaseM(crust)) error(400, depthBelowCrust(crust.id));
	return depthM;
}

/** The isotherm (°C) of an isotherm-depth download or overlay, within the shared limits. */
function isothermParam(params: URLSearchParams): number {
	return numberParam(
		params,
		'temperatureC',
		DEFAULT_ISOTHERM_C,
		ISOTHERM_LIMITS_C.min,
		ISOTHERM_LIMITS_C.max
	);
}

/** One download of a finished grid, or the shared 404 (unknown, hidden, unfinished, no σ). */
export async function gridFile(
	db: Db,
	viewer: Viewer,
	id: string,
	name: string,
	params: URLSearchParams = new URLSearchParams()
): Promise<{ body: Buffer | string; type: string; fileName: string }> {
	if (!(name in GRID_FILES)) notFound();
	const file = name as GridFile;
	const row = await gridForViewer(db, viewer, id);
	if (row.status !== 'done') notFound();
	const plan = planOf(row);
	const req = row.request as unknown as GridRequest;
	// A grid of a drawn region is empty outside it, in every overlay and download.
	const outside = req.polygon ? outsideRegion(plan, req.polygon) : null;
	const value = clipCells(cellsOf(row.valueCells)!, outside);
	const rawSigma = cellsOf(row.sigmaCells);
	const sigma = rawSigma && clipCells(rawSigma, outside);
	const wantsSigma = file.startsWith('sigma');
	if (wantsSigma && !sigma) notFound();
	const sources = await gridSources(db, row.datasetIds);
	const fileName = `thermalith-grid-${row.id.slice(0, 8)}-${file}`;
	const type = GRID_FILES[file];
	const what = `${req.method === 'kriging' ? 'Ordinary kriging' : 'IDW'} heat-flow ${wantsSigma ? 'standard error (1 sigma)' : 'estimate'}, mW/m2, EPSG:${plan.crs.epsg}`;
	switch (file) {
		case 'heat-flow.tif':
		case 'sigma.tif': {
			const cite = sources.map((s) => `${s.title} (${s.licence})`).join('; ');
			const description = `Thermalith grid ${row.id}. ${what}. Model estimate. Sources: ${cite}. Full citations: ${`/api/v1/grids/${row.id}/grid.csv`}`;
			return {
				body: await gridGeoTiff(wantsSigma ? sigma! : value, plan, description),
				type,
				fileName
			};
		}
		case 'grid.csv':
			return {
				body: gridCsv(
					plan,
					value,
					sigma,
					[`Thermalith grid ${row.id}: ${what}`, GRID_CAUTION],
					sources
				),
				type,
				fileName
			};
		case 'contours.geojson': {
			const fc = gridContours(plan, value);
			return {
				body: JSON.stringify({
					...fc,
					description: `${what}; filled bands, heatFlowMinMWm2 = lower bound. ${GRID_CAUTION}`,
					sources: sources.map(sourceLine)
				}),
				type,
				fileName
			};
		}
		case 'temperature-at-depth.tif': {
			const crust = crustParam(params);
			const depthM = depthParam(params, crust);
			const t = temperatureAtDepthGrid(value, sigma, depthM, crust);
			const description = `Thermalith grid ${row.id}. Temperature (deg C) at ${depthM} m; bands P10, P50, P90. Model estimate: ${atDepthAssumptions(crust)}`;
			return { body: await gridGeoTiff([t.p10, t.p50, t.p90], plan, description), type, fileName };
		}
		case 'isotherm-depth.tif': {
			const isothermC = isothermParam(params);
			const crust = crustParam(params);
			const d = isothermDepthGrid(value, sigma, isothermC, crust);
			const description = `Thermalith grid ${row.id}. Depth (m) of ${isothermC} deg C; bands P10, P50, P90 (P10 shallowest). Model estimate: ${atDepthAssumptions(crust)}`;
			return { body: await gridGeoTiff([d.p10, d.p50, d.p90], plan, description), type, fileName };
		}
		case 'temperature-at-depth.png': {
			const crust = crustParam(params);
			const depthM = depthParam(params, crust);
			const band = percentileBand(params, sigma !== null);
			const cells = temperatureAtDepthGrid(value, sigma, depthM, crust)[band];
			const classes = temperatureClasses(depthM);
			const png = await gridOverlayPng(
				plan,
				cells,
				(t) => overlayColour(classes, t),
				gridBoundsWgs84(plan)
			);
			return { body: png, type, fileName };
		}
		case 'isotherm-depth.png': {
			const isothermC = isothermParam(params);
			const crust = crustParam(params);
			const band = percentileBand(params, sigma !== null);
			const depth = isothermDepthGrid(value, sigma, isothermC, crust)[band];
			// A cell with a heat flow whose isotherm lies below the crust is drawn (grey), not empty.
			for (let c = 0; c < depth.length; c++)
				if (Number.isNaN(depth[c]) && !Number.isNaN(value[c])) depth[c] = Infinity;
			const classes = isothermDepthClasses(isothermC);
			const png = await gridOverlayPng(
				plan,
				depth,
				(m) => overlayColour(classes, m / 1000),
				gridBoundsWgs84(plan)
			);
			return { body: png, type, fileName };
		}
		case 'heat-flow.png':
		case 'sigma.png':
			return {
				body: await gridOverlayPng(
					plan,
					wantsSigma ? sigma! : value,
					wantsSigma ? 'sigma' : 'value',
					gridBoundsWgs84(plan)
				),
				type,
				fileName
			};
	}
}

/** Read and check a region-statistics request; 400 with one sentence otherwise. */
export function parseRegionRequest(body: unknown) {
	const parsed = regionStatisticsRequestSchema.safeParse(body);
	if (!parsed.success) error(400, `Bad region: ${requestProblem(parsed.error)}.`);
	return parsed.data;
}

/**
 * Area-weighted statistics of a finished grid inside a drawn region, through the same access
 * check as the grid itself (gridForViewer); an unfinished grid is the shared 404, like its files.
 */
export async function gridRegionStatisticsFor(
	db: Db,
	viewer: Viewer,
	id: string,
	body: unknown
): Promise<RegionStatistics & { gridId: string; crs: { epsg: number }; caution: string }> {
	const region = parseRegionRequest(await withSavedRegion(db, viewer, body));
	const row = await gridForViewer(db, viewer, id);
	if (row.status !== 'done') notFound();
	const plan = planOf(row);
	const req = row.request as unknown as GridRequest;
	// The grid's own drawn region bounds it here too: cells outside it are empty everywhere.
	const outside = req.polygon ? outsideRegion(plan, req.polygon) : null;
	const sigma = cellsOf(row.sigmaCells);
	const stats = gridRegionStatistics(
		plan,
		clipCells(cellsOf(row.valueCells)!, outside),
		sigma && clipCells(sigma, outside),
		region
	);
	return { gridId: row.id, crs: { epsg: plan.crs.epsg }, ...stats, caution: GRID_CAUTION };
}

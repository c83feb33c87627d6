import { error } from '@sveltejs/kit';
import { and, asc, count, eq, inArray, or, sql, type SQL } from 'drizzle-orm';
import {
	CELL_PX,
	cellSizeM,
	MAX_SITES,
	MERCATOR_MAX_LAT,
	MERCATOR_RADIUS_M,
	SITE_ZOOM,
	type MapCell,
	type MapData
} from '$lib/map/grid';
import { HISTOGRAM_BIN_MWM2, HISTOGRAM_MAX_MWM2, type RegionStatistics } from '$lib/map/region';
import { ringBounds, type Position, type Region } from '$lib/map/region-shape';
import type { SiteSearchHit } from '$lib/map/search';
import type { SiteFilters } from '$lib/sites/filters';
import { visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site } from '../db/schema';
import {
	cellRange,
	combineParts,
	prebuiltCanAnswer,
	prebuiltParts,
	refreshStaleCellsSoon,
	staleDatasetIds,
	type CellParts
} from './map-cells';
import { siteFilterConditions, visibleSitesInBox, type BoundingBox } from './sites';
import { indexCanAnswer, siteTest } from '../map-index/block';
import { blockCellParts, blockCount } from '../map-index/cells';
import { addSite, sampleBlocks, summarise } from '../map-index/region-stats';
import { mapIndexEnabled, planIndex } from '../map-index/store';

/**
 * The map's data at scale. Every query here joins `dataset` and adds visibleOnMaps (the one map
 * rule) and the shared filters before anything is counted or grouped, so a cell, a count or a
 * statistic only ever holds sites the viewer may see: a hidden site never makes a cell appear.
 */

const envelope = (box: BoundingBox) =>
	sql`ST_MakeEnvelope(${box.west}, ${box.south}, ${box.east}, ${box.north}, 4326)`;

function where(viewer: Viewer, filters: SiteFilters, box?: BoundingBox): SQL {
	return and(
		box ? sql`${site.location} && ${envelope(box)}` : undefined,
		visibleOnMaps(viewer),
		...siteFilterConditions(filters)
	)!;
}

const polygonGeometry = (ring: readonly Position[]) =>
	sql`ST_SetSRID(ST_GeomFromGeoJSON(${JSON.stringify({ type: 'Polygon', coordinates: [ring] })}), 4326)`;

/**
 * Sites inside a region: the box test first (GiST index), then, for a polygon, the exact test
 * (points on the outline count as inside).
 */
export function regionCondition(region: Region): SQL {
	if (region.kind === 'bbox') return sql`${site.location} && ${envelope(region.box)}`;
	return and(
		sql`${site.location} && ${envelope(ringBounds(region.ring))}`,
		sql`ST_Intersects(${site.location}, ${polygonGeometry(region.ring)})`
	)!;
}

/** A polygon that crosses itself is refused with PostGIS's reason (a 400), not half-answered. */
export async function assertValidRegion(db: Db, region: Region): Promise<void> {
	if (region.kind !== 'polygon') return;
	const [row] = await db.execute<{ reason: string }>(
		sql`SELECT ST_IsValidReason(${polygonGeometry(region.ring)}) AS reason`
	);
	if (row.reason !== 'Valid Geometry') error(400, `the polygon is not valid: ${row.reason}`);
}

/** The visible sites matching the filters inside a region (statistics and downloads). */
export function regionWhere(viewer: Viewer, filters: SiteFilters, region: Region): SQL {
	return and(regionCondition(region), visibleOnMaps(viewer), ...siteFilterConditions(filters))!;
}

/**
 * Cell index expressions in Web Mercator metres, written out (not ST_Transform) because plain
 * arithmetic on ST_X/ST_Y is several times cheaper per row. The numbers are ours (from the zoom),
 * inlined so SELECT and GROUP BY are the same expression.
 */
function cellIndex(zoom: number) {
	const size = cellSizeM(zoom);
	const perDegree = (Math.PI * MERCATOR_RADIUS_M) / 180;
	const ix = sql<number>`floor(ST_X(${site.location}) * ${sql.raw(String(perDegree))} / ${sql.raw(String(size))})::int`;
	const iy = sql<number>`floor(${sql.raw(String(MERCATOR_RADIUS_M))} * ln(tan(pi() / 4 + radians(greatest(${sql.raw(String(-MERCATOR_MAX_LAT))}, least(${sql.raw(String(MERCATOR_MAX_LAT))}, ST_Y(${site.location})))) / 2)) / ${sql.raw(String(size))})::int`;
	return { ix, iy };
}

/** Cell sums of the visible, matching sites in a box at a zoom, straight from the sites. */
async function liveParts(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	zoom: number,
	filters: SiteFilters,
	datasetIds?: string[]
): Promise<CellParts[]> {
	const { ix, iy } = cellIndex(zoom);
	const hf = site.heatFlowMWm2;
	return db
		.select({
			ix,
			iy,
			count: sql<number>`count(*)::int`,
			withValue: sql<number>`count(${hf})::int`,
			sumMWm2: sql<number | null>`sum(${hf})`,
			minMWm2: sql<number | null>`min(${hf})`,
			maxMWm2: sql<number | null>`max(${hf})`
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(
			and(where(viewer, filters, box), datasetIds ? inArray(site.datasetId, datasetIds) : undefined)
		)
		.groupBy(ix, iy);
}

/** Grid cells of the visible, matching sites in a box at a zoom, from the sites. */
export async function mapCells(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	zoom: number,
	filters: SiteFilters
): Promise<MapCell[]> {
	return combineParts(await liveParts(db, viewer, box, zoom, filters));
}

/**
 * Filtered cells from the in-memory site index (server/map-index): loaded, current datasets from
 * memory, the visible datasets not loaded (or changed since) from their sites, added up.
 */
export async function indexedCells(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	zoom: number,
	filters: SiteFilters
): Promise<MapCell[]> {
	const plan = await planIndex(db, viewer, filters);
	const memory = blockCellParts(plan.blocks, box, zoom, siteTest(filters));
	const live = plan.sqlDatasetIds.length
		? await liveParts(db, viewer, box, zoom, filters, plan.sqlDatasetIds)
		: [];
	return combineParts(memory, live);
}

/** Whether a filtered request is answered with the in-memory site index. */
const useIndex = (filters: SiteFilters) => mapIndexEnabled() && indexCanAnswer(filters);

/**
 * Whole cells covering the box from the pre-built cells of the visible datasets, plus the cells
 * of stale datasets from their sites (map-cells.ts); the stale list is read once so each dataset
 * is counted by exactly one of the two.
 */
async function prebuiltCells(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	zoom: number,
	filters: SiteFilters
): Promise<MapCell[]> {
	const range = cellRange(box, zoom);
	const stale = await staleDatasetIds(db);
	const [built, live] = await Promise.all([
		prebuiltParts(db, viewer, range, zoom, filters, stale),
		stale.length ? liveParts(db, viewer, range.whole, zoom, filters, stale) : []
	]);
	refreshStaleCellsSoon(db, stale);
	return combineParts(built, live);
}

/**
 * What the map draws for a view: single sites from SITE_ZOOM when the view holds at most
 * MAX_SITES of them, otherwise cells. Up to PREBUILT_MAX_ZOOM without site filters the cells are
 * the pre-built ones, asked first: a crowded view then costs no site query at all. With site
 * filters the in-memory index answers the cells first, for the same reason.
 */
export async function mapData(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	zoom: number,
	filters: SiteFilters
): Promise<MapData> {
	const cellsAnswer = (cells: MapCell[]): MapData => ({
		kind: 'cells',
		zoom,
		cellPx: CELL_PX,
		count: cells.reduce((n, c) => n + c.count, 0),
		cells
	});
	let cells: MapCell[] | undefined;
	if (prebuiltCanAnswer(zoom, filters)) {
		cells = await prebuiltCells(db, viewer, box, zoom, filters);
		// Whole cells hold at least the sites of the view: more than MAX_SITES means cells.
		if (zoom < SITE_ZOOM || cells.reduce((n, c) => n + c.count, 0) > MAX_SITES)
			return cellsAnswer(cells);
	} else if (useIndex(filters)) {
		cells = await indexedCells(db, viewer, box, zoom, filters);
		// These cells hold exactly the sites of the view.
		if (zoom < SITE_ZOOM || cells.reduce((n, c) => n + c.count, 0) > MAX_SITES)
			return cellsAnswer(cells);
	}
	if (zoom >= SITE_ZOOM) {
		// Unordered, so a crowded view stops at MAX_SITES + 1 rows; sorted here for a stable ETag.
		const sites = await visibleSitesInBox(db, viewer, box, filters, MAX_SITES + 1, false);
		if (sites.length <= MAX_SITES) {
			sites.sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : a.id < b.id ? -1 : 1));
			return { kind: 'sites', zoom, count: sites.length, sites };
		}
	}
	return cellsAnswer(cells ?? (await mapCells(db, viewer, box, zoom, filters)));
}

/** How many visible sites match the filters anywhere (the filter panel's live count). */
export async function countMatchingSites(
	db: Db,
	viewer: Viewer,
	filters: SiteFilters
): Promise<number> {
	// Without site filters: the zoom-0 pre-built cells of the whole world hold every site once.
	if (prebuiltCanAnswer(0, filters)) {
		const world = { west: -180, south: -90, east: 180, north: 90 };
		const cells = await prebuiltCells(db, viewer, world, 0, filters);
		return cells.reduce((n, c) => n + c.count, 0);
	}
	const sqlCount = async (datasetIds?: string[]) => {
		const [row] = await db
			.select({ n: count() })
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(
				and(where(viewer, filters), datasetIds ? inArray(site.datasetId, datasetIds) : undefined)
			);
		return row.n;
	};
	if (!useIndex(filters)) return sqlCount();
	const plan = await planIndex(db, viewer, filters);
	const memory = blockCount(plan.blocks, siteTest(filters));
	return memory + (plan.sqlDatasetIds.length ? await sqlCount(plan.sqlDatasetIds) : 0);
}

/** Visible sites whose code or name starts with `prefix` (case-insensitive), by code. */
export async function searchVisibleSites(
	db: Db,
	viewer: Viewer,
	prefix: string,
	limit = 10
): Promise<SiteSearchHit[]> {
	// lower(…) LIKE 'prefix%' uses the text_pattern_ops indexes of migration 0011.
	const pattern = `${prefix.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
	return db
		.select({
			id: site.id,
			code: site.code,
			name: site.name,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(
			and(
				or(sql`lower(${site.code}) LIKE ${pattern}`, sql`lower(${site.name}) LIKE ${pattern}`),
				visibleOnMaps(viewer)
			)
		)
		.orderBy(asc(site.code))
		.limit(limit);
}

/**
 * Statistics of the visible, matching sites inside a region (rectangle or polygon). Percentiles are PostgreSQL's
 * percentile_cont (linear interpolation between order statistics, definition 7 of Hyndman & Fan
 * 1996, from memory); the standard deviation is the sample one (stddev_samp).
 */
export async function regionStatistics(
	db: Db,
	viewer: Viewer,
	region: Region,
	filters: SiteFilters
): Promise<RegionStatistics> {
	await assertValidRegion(db, region);
	// Values of loaded datasets from memory, of the others from their sites, summarised together;
	// with nothing loaded yet (just after start) the aggregate SQL below is cheaper.
	const plan = useIndex(filters) ? await planIndex(db, viewer, filters) : null;
	if (plan && plan.blocks.length > 0) {
		const sample = sampleBlocks(plan.blocks, region, siteTest(filters));
		if (plan.sqlDatasetIds.length) {
			const rows = await db
				.select({ qualityClass: site.qualityClass, hf: site.heatFlowMWm2 })
				.from(site)
				.innerJoin(dataset, eq(site.datasetId, dataset.id))
				.where(
					and(regionWhere(viewer, filters, region), inArray(site.datasetId, plan.sqlDatasetIds))
				);
			for (const r of rows) addSite(sample, r.qualityClass, r.hf);
		}
		return summarise(sample);
	}
	const hf = site.heatFlowMWm2;
	const condition = regionWhere(viewer, filters, region);
	const bin = sql<number>`least(floor(${hf} / ${sql.raw(String(HISTOGRAM_BIN_MWM2))}), ${sql.raw(String(HISTOGRAM_MAX_MWM2 / HISTOGRAM_BIN_MWM2))})::int`;
	const [[stats], bins, quality] = await Promise.all([
		db
			.select({
				count: sql<number>`count(*)::int`,
				withValue: sql<number>`count(${hf})::int`,
				meanMWm2: sql<number | null>`avg(${hf})::float8`,
				stdDevMWm2: sql<number | null>`stddev_samp(${hf})::float8`,
				p: sql<
					number[] | null
				>`percentile_cont(ARRAY[0.1, 0.5, 0.9]) WITHIN GROUP (ORDER BY ${hf})`,
				minMWm2: sql<number | null>`min(${hf})`,
				maxMWm2: sql<number | null>`max(${hf})`
			})
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(condition),
		db
			.select({ bin, count: sql<number>`count(*)::int` })
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(and(condition, sql`${hf} IS NOT NULL`))
			.groupBy(bin)
			.orderBy(bin),
		db
			.select({ qualityClass: site.qualityClass, count: sql<number>`count(*)::int` })
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(condition)
			.groupBy(site.qualityClass)
			.orderBy(site.qualityClass)
	]);
	const p = stats.withValue > 0 && stats.p ? stats.p.map(Number) : null;
	return {
		count: stats.count,
		withValue: stats.withValue,
		meanMWm2: stats.meanMWm2,
		medianMWm2: p ? p[1] : null,
		stdDevMWm2: stats.stdDevMWm2,
		p10MWm2: p ? p[0] : null,
		p90MWm2: p ? p[2] : null,
		minMWm2: stats.minMWm2,
		maxMWm2: stats.maxMWm2,
		histogram: bins.map((b) => ({ fromMWm2: b.bin * HISTOGRAM_BIN_MWM2, count: b.count })),
		quality
	};
}

/** The organisations and datasets the filter panel offers: those with data on the viewer's maps. */
export async function mapFilterOptions(db: Db, viewer: Viewer) {
	const rows = await db
		.select({
			datasetId: dataset.id,
			title: dataset.title,
			organisationId: dataset.organisationId,
			organisationName: organisation.name
		})
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(visibleOnMaps(viewer))
		.orderBy(asc(organisation.name), asc(dataset.title));
	const organisations = [
		...new Map(
			rows.map((r) => [r.organisationId, { id: r.organisationId, name: r.organisationName }])
		).values()
	];
	const datasets = rows.map((r) => ({
		id: r.datasetId,
		title: r.title,
		organisationId: r.organisationId
	}));
	return { organisations, datasets };
}

import {
	and,
	arrayOverlaps,
	asc,
	count,
	desc,
	eq,
	gte,
	ilike,
	inArray,
	lte,
	or,
	sql,
	type SQL
} from 'drizzle-orm';
import { NO_FILTERS, type SiteFilters } from '$lib/sites/filters';
import type { SiteListQuery } from '$lib/sites/list-query';
import type { SiteSummary } from '$lib/sites/summary';
import { visibleDatasets, visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site, temperatureLog } from '../db/schema';

export interface BoundingBox {
	west: number;
	south: number;
	east: number;
	north: number;
}

/**
 * The columns of a SiteSummary (the one shape, $lib/sites/summary.ts): `satisfies` keeps the key
 * set equal to the type's, and the readers' return types check each column's type.
 */
const siteSummaryColumns = {
	id: site.id,
	code: site.code,
	name: site.name,
	lon: sql<number>`ST_X(${site.location})`,
	lat: sql<number>`ST_Y(${site.location})`,
	heatFlowMWm2: site.heatFlowMWm2,
	heatFlowSigmaMWm2: site.heatFlowSigmaMWm2,
	method: site.method,
	qualityClass: site.qualityClass,
	yearMeasured: site.yearMeasured,
	datasetTitle: dataset.title,
	organisationName: organisation.name
} satisfies Record<keyof SiteSummary, unknown>;

/** The shared site filters ($lib/sites/filters.ts) as SQL; `page` is the caller's business. */
export function siteFilterConditions(f: SiteFilters): SQL[] {
	const conditions: SQL[] = [];
	if (f.quality.length) conditions.push(inArray(site.qualityClass, f.quality));
	if (f.method.length) conditions.push(inArray(site.method, f.method));
	if (f.minHeatFlow !== null) conditions.push(gte(site.heatFlowMWm2, f.minHeatFlow));
	if (f.maxHeatFlow !== null) conditions.push(lte(site.heatFlowMWm2, f.maxHeatFlow));
	if (f.q) {
		const pattern = `%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		conditions.push(or(ilike(site.code, pattern), ilike(site.name, pattern))!);
	}
	if (f.organisation.length) conditions.push(inArray(dataset.organisationId, f.organisation));
	if (f.dataset.length) conditions.push(inArray(site.datasetId, f.dataset));
	if (f.yearFrom !== null) conditions.push(gte(site.yearMeasured, f.yearFrom));
	if (f.yearTo !== null) conditions.push(lte(site.yearMeasured, f.yearTo));
	// && (overlaps) uses the GIN index on flags: a site with any of the chosen flags.
	if (f.flag.length) conditions.push(arrayOverlaps(site.flags, f.flag));
	if (f.hasLog) {
		conditions.push(
			sql`EXISTS (SELECT 1 FROM ${temperatureLog} WHERE ${temperatureLog.siteId} = ${site.id})`
		);
	}
	return conditions;
}

/**
 * Sites the viewer may see on maps (retired datasets left out) inside a WGS 84 bounding box (uses the GiST index on location),
 * at most `limit` rows, ordered by code for stable paging (`ordered`; without it the database
 * may stop at `limit` rows instead of sorting every match, which the map needs at scale).
 */
export async function visibleSitesInBox(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	filters: SiteFilters = NO_FILTERS,
	limit = 100_000,
	ordered = true
): Promise<SiteSummary[]> {
	const envelope = sql`ST_MakeEnvelope(${box.west}, ${box.south}, ${box.east}, ${box.north}, 4326)`;
	const query = db
		.select(siteSummaryColumns)
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(
			and(
				sql`${site.location} && ${envelope}`,
				visibleOnMaps(viewer),
				...siteFilterConditions(filters)
			)
		)
		.$dynamic();
	return (ordered ? query.orderBy(asc(site.code)) : query).limit(limit);
}

const SORTS = {
	code: site.code,
	name: site.name,
	heatFlowMWm2: site.heatFlowMWm2,
	qualityClass: site.qualityClass,
	method: site.method,
	yearMeasured: site.yearMeasured
};

/** One page of a dataset's sites the viewer may see, sorted and filtered in the database. */
export async function listDatasetSites(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	query: SiteListQuery
): Promise<{ rows: SiteSummary[]; total: number }> {
	const where = and(
		eq(site.datasetId, datasetId),
		visibleDatasets(viewer),
		...siteFilterConditions(query)
	);
	const order = query.dir === 'desc' ? desc(SORTS[query.sort]) : asc(SORTS[query.sort]);
	const [rows, [{ total }]] = await Promise.all([
		db
			.select(siteSummaryColumns)
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
			.where(where)
			.orderBy(order, asc(site.code))
			.limit(query.pageSize)
			.offset((query.page - 1) * query.pageSize),
		db
			.select({ total: count() })
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(where)
	]);
	return { rows, total };
}

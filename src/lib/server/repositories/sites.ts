import { and, asc, eq, gte, inArray, lte, sql, type SQL } from 'drizzle-orm';
import { NO_FILTERS, type SiteFilters } from '$lib/map/filters';
import { visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site } from '../db/schema';

export interface BoundingBox {
	west: number;
	south: number;
	east: number;
	north: number;
}

export interface SiteSummary {
	id: string;
	code: string;
	name: string | null;
	lon: number;
	lat: number;
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	method: string;
	qualityClass: string | null;
	datasetTitle: string;
	organisationName: string;
}

/**
 * Sites the viewer may see on maps (retired datasets left out) inside a WGS 84 bounding box (uses the GiST index on location),
 * at most `limit` rows, ordered by code for stable paging.
 */
export async function visibleSitesInBox(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	filters: SiteFilters = NO_FILTERS,
	limit = 100_000
): Promise<SiteSummary[]> {
	const envelope = sql`ST_MakeEnvelope(${box.west}, ${box.south}, ${box.east}, ${box.north}, 4326)`;
	const conditions: SQL[] = [sql`${site.location} && ${envelope}`, visibleOnMaps(viewer)];
	if (filters.quality.length) conditions.push(inArray(site.qualityClass, filters.quality));
	if (filters.method.length) conditions.push(inArray(site.method, filters.method));
	if (filters.minHeatFlowMWm2 !== null)
		conditions.push(gte(site.heatFlowMWm2, filters.minHeatFlowMWm2));
	if (filters.maxHeatFlowMWm2 !== null)
		conditions.push(lte(site.heatFlowMWm2, filters.maxHeatFlowMWm2));
	return db
		.select({
			id: site.id,
			code: site.code,
			name: site.name,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`,
			heatFlowMWm2: site.heatFlowMWm2,
			heatFlowSigmaMWm2: site.heatFlowSigmaMWm2,
			method: site.method,
			qualityClass: site.qualityClass,
			datasetTitle: dataset.title,
			organisationName: organisation.name
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(...conditions))
		.orderBy(asc(site.code))
		.limit(limit);
}

import { and, asc, eq, sql } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
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
 * Sites the viewer may see inside a WGS 84 bounding box (uses the GiST index on location),
 * at most `limit` rows, ordered by code for stable paging.
 */
export async function visibleSitesInBox(
	db: Db,
	viewer: Viewer,
	box: BoundingBox,
	limit = 100_000
): Promise<SiteSummary[]> {
	const envelope = sql`ST_MakeEnvelope(${box.west}, ${box.south}, ${box.east}, ${box.north}, 4326)`;
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
		.where(and(sql`${site.location} && ${envelope}`, visibleDatasets(viewer)))
		.orderBy(asc(site.code))
		.limit(limit);
}

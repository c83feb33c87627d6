import { and, asc, count, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import type { SiteListQuery } from '$lib/sites/list-query';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, site } from '../db/schema';

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
) {
	const conditions: SQL[] = [eq(site.datasetId, datasetId), visibleDatasets(viewer)];
	if (query.q) {
		const pattern = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		conditions.push(or(ilike(site.code, pattern), ilike(site.name, pattern))!);
	}
	if (query.quality) conditions.push(eq(site.qualityClass, query.quality));
	if (query.method) conditions.push(sql`${site.method}::text = ${query.method}`);
	const where = and(...conditions);
	const order = query.dir === 'desc' ? desc(SORTS[query.sort]) : asc(SORTS[query.sort]);
	const [rows, [{ total }]] = await Promise.all([
		db
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
				yearMeasured: site.yearMeasured
			})
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
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

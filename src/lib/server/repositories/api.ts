import { and, asc, count, desc, eq, gt, inArray, lt, sql, type SQL } from 'drizzle-orm';
import type { BBox } from '$lib/geo/bbox';
import type { SiteFilters } from '$lib/sites/filters';
import { notFound, requireUuid, visibleDatasets, visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site, temperatureLog } from '../db/schema';
import { siteFilterConditions } from './sites';

/*
 * Queries behind /api/v1. Every list is keyset-paged (never OFFSET): the cursor is the last row's
 * sort key and id, so a row added or removed between two requests moves no other row to another
 * page and a script that follows `next` gets each row once. One row more than asked tells
 * whether a next page exists.
 */

export interface Keyset {
	/** Sort value and id of the last row of the previous page. */
	after: [string, string] | null;
	limit: number;
	descending?: boolean;
}

function page<T>(rows: T[], limit: number, key: (row: T) => [string, string]) {
	const more = rows.length > limit;
	const items = rows.slice(0, limit);
	return { items, next: more ? key(items[items.length - 1]) : null };
}

// ---- organisations (a public directory, like /organisations) ------------------------------

export async function organisationsPage(db: Db, ks: Keyset) {
	const rows = await db
		.select({
			id: organisation.id,
			name: organisation.name,
			slug: organisation.slug,
			country: organisation.country,
			website: organisation.website,
			description: organisation.description
		})
		.from(organisation)
		.where(ks.after ? gt(organisation.id, ks.after[1]) : undefined)
		.orderBy(asc(organisation.id))
		.limit(ks.limit + 1);
	return page(rows, ks.limit, (r) => [r.id, r.id]);
}

// ---- datasets (every dataset the viewer may open, retired ones included) --------------------

const datasetColumns = {
	id: dataset.id,
	title: dataset.title,
	abstract: dataset.abstract,
	keywords: dataset.keywords,
	organisationId: dataset.organisationId,
	organisationName: organisation.name,
	licence: dataset.licence,
	version: dataset.version,
	status: dataset.status,
	visibility: dataset.visibility,
	embargoUntil: dataset.embargoUntil,
	doi: dataset.doi,
	citation: dataset.citation,
	updatedAt: dataset.updatedAt,
	sites: sql<number>`(SELECT count(*)::int FROM ${site} WHERE ${site.datasetId} = ${dataset.id})`
};

export type ApiDatasetRow = Awaited<ReturnType<typeof datasetById>>;

export async function datasetsPage(db: Db, viewer: Viewer, ks: Keyset, organisationId?: string) {
	const rows = await db
		.select(datasetColumns)
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(
			and(
				visibleDatasets(viewer),
				organisationId === undefined ? undefined : eq(dataset.organisationId, organisationId),
				ks.after ? gt(dataset.id, ks.after[1]) : undefined
			)
		)
		.orderBy(asc(dataset.id))
		.limit(ks.limit + 1);
	return page(rows, ks.limit, (r) => [r.id, r.id]);
}

/** One dataset the viewer may see; the common 404 otherwise. */
export async function datasetById(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [row] = await db
		.select(datasetColumns)
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(dataset.id, id), visibleDatasets(viewer)));
	if (!row) notFound();
	return row;
}

// ---- sites (the map's sites: what the viewer sees on the map, as /ogc does) ----------------

const siteColumns = {
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
	datasetId: site.datasetId,
	datasetTitle: dataset.title,
	organisationName: organisation.name
};

export type ApiSiteRow = Awaited<ReturnType<typeof siteById>>;

export interface SiteSelection {
	filters: SiteFilters;
	bbox: BBox | null;
	datasetId?: string;
	sort: 'id' | 'code';
}

export async function sitesPage(db: Db, viewer: Viewer, sel: SiteSelection, ks: Keyset) {
	const sortColumn = sel.sort === 'code' ? site.code : site.id;
	const conditions: (SQL | undefined)[] = [
		visibleOnMaps(viewer),
		...siteFilterConditions(sel.filters),
		sel.datasetId === undefined ? undefined : eq(site.datasetId, sel.datasetId),
		sel.bbox
			? sql`${site.location} && ST_MakeEnvelope(${sel.bbox.west}, ${sel.bbox.south}, ${sel.bbox.east}, ${sel.bbox.north}, 4326)`
			: undefined
	];
	if (ks.after) {
		const [value, id] = ks.after;
		const position =
			sel.sort === 'id'
				? (ks.descending ? lt : gt)(site.id, id)
				: ks.descending
					? sql`(${site.code}, ${site.id}) < (${value}, ${id}::uuid)`
					: sql`(${site.code}, ${site.id}) > (${value}, ${id}::uuid)`;
		conditions.push(position);
	}
	const direction = ks.descending ? desc : asc;
	const rows = await db
		.select(siteColumns)
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(...conditions))
		.orderBy(direction(sortColumn), direction(site.id))
		.limit(ks.limit + 1);
	return page(rows, ks.limit, (r) => [sel.sort === 'code' ? r.code : r.id, r.id]);
}

/** One site of a dataset the viewer may see (as its page); the common 404 otherwise. */
export async function siteById(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [row] = await db
		.select(siteColumns)
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(site.id, id), visibleDatasets(viewer)));
	if (!row) notFound();
	return row;
}

/** The temperature logs of a site the viewer may see, oldest first; the common 404 otherwise. */
export async function siteTemperatureLogs(db: Db, viewer: Viewer, siteId: string) {
	await siteById(db, viewer, siteId);
	return db
		.select({
			id: temperatureLog.id,
			siteId: temperatureLog.siteId,
			name: temperatureLog.name,
			depthM: temperatureLog.depthM,
			temperatureC: temperatureLog.temperatureC,
			createdAt: temperatureLog.createdAt
		})
		.from(temperatureLog)
		.where(eq(temperatureLog.siteId, siteId))
		.orderBy(asc(temperatureLog.createdAt), asc(temperatureLog.id));
}

/** How many sites a viewer sees on the map (tests compare a script's total with it). */
export async function mapSiteCount(db: Db, viewer: Viewer, datasetIds?: string[]) {
	const [{ n }] = await db
		.select({ n: count() })
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(
			and(visibleOnMaps(viewer), datasetIds ? inArray(site.datasetId, datasetIds) : undefined)
		);
	return n;
}

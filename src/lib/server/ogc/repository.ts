import {
	and,
	asc,
	count,
	desc,
	eq,
	gt,
	gte,
	inArray,
	isNull,
	lt,
	lte,
	notInArray,
	or,
	sql,
	type SQL
} from 'drizzle-orm';
import { citationFields } from '$lib/datasets/citation';
import { isUuid } from '$lib/uuid';
import { visibleOnMaps, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, mapCell, mapCellStale, organisation, site } from '../db/schema';
import { yearRange, type CollectionRef, type ItemsQuery, type OgcBox } from './params';

/*
 * The queries behind /ogc. A GIS layer is a map: it shows what the app's map shows the same
 * viewer (visibleOnMaps: visible datasets, retired ones left off), so a signed-in member sees
 * their organisation's unpublished sites in the `sites` collection as on the map. A collection
 * per dataset is offered for published datasets only.
 */

/** One site as a feature: properties carry their unit in their name, and the dataset's terms. */
export interface OgcSite {
	id: string;
	lon: number;
	lat: number;
	code: string;
	name: string | null;
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	gradientKPerKm: number | null;
	conductivityWmK: number | null;
	heatProductionUWm3: number | null;
	elevationM: number | null;
	topDepthM: number | null;
	bottomDepthM: number | null;
	method: string;
	qualityClass: string | null;
	yearMeasured: number | null;
	datasetId: string;
	datasetTitle: string;
	datasetVersion: number;
	organisationName: string;
	licence: string;
	citation: string;
	doi: string | null;
}

export interface OgcCollectionRow {
	ref: CollectionRef;
	title: string;
	description: string;
	licence: string | null;
	/** The built citation (citationFields, as on the dataset page and in downloads). */
	citation: string | null;
	extent: { bbox: [number, number, number, number] | null; years: [number, number] | null };
}

const featureColumns = {
	id: site.id,
	lon: sql<number>`ST_X(${site.location})`,
	lat: sql<number>`ST_Y(${site.location})`,
	code: site.code,
	name: site.name,
	heatFlowMWm2: site.heatFlowMWm2,
	heatFlowSigmaMWm2: site.heatFlowSigmaMWm2,
	gradientKPerKm: site.gradientKPerKm,
	conductivityWmK: site.conductivityWmK,
	heatProductionUWm3: site.heatProductionUWm3,
	elevationM: site.elevationM,
	topDepthM: site.topDepthM,
	bottomDepthM: site.bottomDepthM,
	method: site.method,
	qualityClass: site.qualityClass,
	yearMeasured: site.yearMeasured,
	datasetId: dataset.id,
	datasetTitle: dataset.title,
	datasetVersion: dataset.version,
	organisationName: organisation.name,
	licence: dataset.licence,
	citation: dataset.citation,
	doi: dataset.doi
};

/**
 * Which sites belong to a collection, for this viewer: conditions on their dataset only, so the
 * map's stored cells (joined to the dataset the same way) can count a collection too.
 */
function inCollection(viewer: Viewer, ref: CollectionRef): SQL[] {
	const base = [visibleOnMaps(viewer)];
	if (ref.kind === 'dataset')
		base.push(eq(dataset.id, ref.datasetId), eq(dataset.status, 'published'));
	return base;
}

const envelope = (w: number, s: number, e: number, n: number) =>
	sql`${site.location} && ST_MakeEnvelope(${w}, ${s}, ${e}, ${n}, 4326)`;

/** A box across the antimeridian (west > east) is the union of its two halves. */
function inBox(box: OgcBox): SQL {
	if (box.west <= box.east) return envelope(box.west, box.south, box.east, box.north);
	return or(
		envelope(box.west, box.south, 180, box.north),
		envelope(-180, box.south, box.east, box.north)
	)!;
}

/** Selection parameters (bbox, datetime) without the page position. */
function selection(viewer: Viewer, ref: CollectionRef, query: ItemsQuery): SQL[] {
	const conditions = inCollection(viewer, ref);
	if (query.bbox) conditions.push(inBox(query.bbox));
	if (query.datetime) {
		const { from, to } = yearRange(query.datetime);
		const inRange = and(
			from === null ? undefined : gte(site.yearMeasured, from),
			to === null ? undefined : lte(site.yearMeasured, to)
		);
		// Sites without a year have no temporal geometry: datetime matches them too
		// (/req/core/fc-time-response C).
		conditions.push(or(isNull(site.yearMeasured), inRange)!);
	}
	return conditions;
}

export interface ItemsPage {
	features: OgcSite[];
	/** Null when counting is not cheap (the member is optional: OGC 17-069r4, 7.15.6). */
	numberMatched: number | null;
	/** Ids for the next and previous links, null where there is no such page. */
	nextAfter: string | null;
	prevBefore: string | null;
}

/**
 * Counting every match on every request is what made large collections slow: a selection is
 * counted only up to this many matches. Past it, an unfiltered collection is counted from the
 * map's stored cells; a filtered one goes without numberMatched.
 */
export const COUNT_CAP = 10_000;

/**
 * One page of a collection in feature-id order (keyset paging on the site's UUID, never OFFSET):
 * a site inserted or removed between two requests shifts no other site to another page, so a
 * client that follows `next` gets every site once.
 */
export async function itemsPage(
	db: Db,
	viewer: Viewer,
	ref: CollectionRef,
	query: ItemsQuery,
	options: { countCap?: number } = {}
): Promise<ItemsPage> {
	const countCap = options.countCap ?? COUNT_CAP;
	const where = selection(viewer, ref, query);
	const cursor = query.cursor;
	const backwards = cursor !== null && 'before' in cursor;
	const position =
		cursor === null
			? []
			: 'after' in cursor
				? [gt(site.id, cursor.after)]
				: [lt(site.id, cursor.before)];
	const matches = db
		.select({ one: sql`1` })
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(and(...where))
		.limit(countCap + 1)
		.as('matches');
	const [rows, [{ upTo }]] = await Promise.all([
		db
			.select(featureColumns)
			.from(site)
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
			.where(and(...where, ...position))
			.orderBy(backwards ? desc(site.id) : asc(site.id))
			// One more than asked tells whether another page follows in this direction.
			.limit(query.limit + 1),
		db.select({ upTo: count() }).from(matches)
	]);
	const more = rows.length > query.limit;
	const page = rows.slice(0, query.limit);
	if (backwards) page.reverse();
	const first = page[0]?.id ?? null;
	const last = page.at(-1)?.id ?? null;
	const unfiltered = query.bbox === null && query.datetime === null;
	return {
		features: page,
		numberMatched:
			// A first page with no next page holds every match.
			cursor === null && !more
				? page.length
				: upTo <= countCap
					? upTo
					: unfiltered
						? await storedCount(db, viewer, ref)
						: null,
		// Forwards: a next page if one more row came back. Backwards: the `before` site follows.
		nextAfter: backwards ? last : more ? last : null,
		// Forwards from a cursor: the cursor's site comes before. Backwards: one more row came back.
		prevBefore: backwards ? (more ? first : null) : cursor !== null ? first : null
	};
}

/**
 * A whole collection's size from the map's stored cells (zoom 0, a few rows per dataset) for
 * datasets whose cells are current, plus a count of the sites of those marked stale, in one
 * statement (one snapshot: the triggers mark a dataset stale with the change itself).
 */
async function storedCount(db: Db, viewer: Viewer, ref: CollectionRef): Promise<number> {
	const stale = db.select({ id: mapCellStale.datasetId }).from(mapCellStale);
	const cells = db
		.select({ n: sql`coalesce(sum(${mapCell.count}), 0)` })
		.from(mapCell)
		.innerJoin(dataset, eq(mapCell.datasetId, dataset.id))
		.where(
			and(eq(mapCell.zoom, 0), ...inCollection(viewer, ref), notInArray(mapCell.datasetId, stale))
		);
	const live = db
		.select({ n: count() })
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(and(...inCollection(viewer, ref), inArray(site.datasetId, stale)));
	const [{ n }] = await db.execute<{ n: number }>(sql`SELECT ((${cells}) + (${live}))::int AS n`);
	return n;
}

/** One site of a collection, or null when it is not in it or not visible (the same answer). */
export async function featureById(
	db: Db,
	viewer: Viewer,
	ref: CollectionRef,
	featureId: string
): Promise<OgcSite | null> {
	if (!isUuid(featureId)) return null;
	const [row] = await db
		.select(featureColumns)
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(site.id, featureId), ...inCollection(viewer, ref)))
		.limit(1);
	return row ?? null;
}

const extentColumns = {
	west: sql<number | null>`ST_XMin(ST_Extent(${site.location}))`,
	south: sql<number | null>`ST_YMin(ST_Extent(${site.location}))`,
	east: sql<number | null>`ST_XMax(ST_Extent(${site.location}))`,
	north: sql<number | null>`ST_YMax(ST_Extent(${site.location}))`,
	firstYear: sql<number | null>`min(${site.yearMeasured})`,
	lastYear: sql<number | null>`max(${site.yearMeasured})`
};

type ExtentRow = { [K in keyof typeof extentColumns]: number | null };

function extentOf(row: ExtentRow | undefined): OgcCollectionRow['extent'] {
	const num = (v: number | null) => (v === null ? null : Number(v));
	const [w, s, e, n] = [row?.west, row?.south, row?.east, row?.north].map((v) => num(v ?? null));
	const [y0, y1] = [num(row?.firstYear ?? null), num(row?.lastYear ?? null)];
	return {
		bbox: w === null || s === null || e === null || n === null ? null : [w, s, e, n],
		years: y0 === null || y1 === null ? null : [y0, y1]
	};
}

const ALL_SITES = {
	title: 'Heat-flow sites',
	description:
		'Every heat-flow site you may see on the map, one point feature each (heat flow in mW/m², with its dataset, licence and citation).'
};

/** The extent of every site this viewer sees on the map (the `sites` collection). */
async function allSitesCollection(db: Db, viewer: Viewer): Promise<OgcCollectionRow> {
	const [all] = await db
		.select(extentColumns)
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(and(...inCollection(viewer, { kind: 'sites' })));
	return {
		ref: { kind: 'sites' },
		...ALL_SITES,
		licence: null,
		citation: null,
		extent: extentOf(all)
	};
}

/** Visible published datasets as collections (one, when `datasetId` is given), by title. */
async function datasetCollections(
	db: Db,
	viewer: Viewer,
	origin: string,
	datasetId?: string
): Promise<OgcCollectionRow[]> {
	const rows = await db
		.select({
			id: dataset.id,
			title: dataset.title,
			abstract: dataset.abstract,
			authors: dataset.authors,
			version: dataset.version,
			licence: dataset.licence,
			doi: dataset.doi,
			status: dataset.status,
			citation: dataset.citation,
			publishedAt: dataset.publishedAt,
			createdAt: dataset.createdAt,
			organisationName: organisation.name,
			...extentColumns
		})
		.from(dataset)
		.innerJoin(organisation, eq(organisation.id, dataset.organisationId))
		.leftJoin(site, eq(site.datasetId, dataset.id))
		.where(
			and(
				visibleOnMaps(viewer),
				eq(dataset.status, 'published'),
				datasetId === undefined ? undefined : eq(dataset.id, datasetId)
			)
		)
		.groupBy(dataset.id, organisation.id)
		.orderBy(asc(dataset.title), asc(dataset.id));
	return rows.map((d) => ({
		ref: { kind: 'dataset', datasetId: d.id } as const,
		title: d.title,
		description: d.abstract,
		licence: d.licence,
		// The one citation of the dataset (author, year, title, version, licence, address), the
		// same as on its page and in its downloads; the free-text note is only part of it there.
		citation: citationFields(d, d.organisationName, origin).citation,
		extent: extentOf(d)
	}));
}

/** The collections this viewer may see: all visible sites, then each visible published dataset. */
export async function collectionsFor(
	db: Db,
	viewer: Viewer,
	origin: string
): Promise<OgcCollectionRow[]> {
	const [all, datasets] = await Promise.all([
		allSitesCollection(db, viewer),
		datasetCollections(db, viewer, origin)
	]);
	return [all, ...datasets];
}

/** One collection, or null when it does not exist or is not visible (the same answer). */
export async function collectionFor(
	db: Db,
	viewer: Viewer,
	ref: CollectionRef,
	origin: string
): Promise<OgcCollectionRow | null> {
	if (ref.kind === 'sites') return allSitesCollection(db, viewer);
	const [d] = await datasetCollections(db, viewer, origin, ref.datasetId);
	return d ?? null;
}

/** Whether a collection exists for this viewer, without computing its extent. */
export async function collectionVisible(
	db: Db,
	viewer: Viewer,
	ref: CollectionRef
): Promise<boolean> {
	if (ref.kind === 'sites') return true;
	const [d] = await db
		.select({ id: dataset.id })
		.from(dataset)
		.where(
			and(eq(dataset.id, ref.datasetId), visibleOnMaps(viewer), eq(dataset.status, 'published'))
		)
		.limit(1);
	return Boolean(d);
}

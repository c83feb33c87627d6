import { error } from '@sveltejs/kit';
import { asc, getTableColumns, eq, inArray, sql } from 'drizzle-orm';
import { citationFields } from '$lib/datasets/citation';
import { regionCsv, regionGeoJson, type RegionDataset } from '$lib/datasets/region-export';
import type { ExportSite } from '$lib/datasets/site-export';
import { polygonToParam, type Region } from '$lib/map/region-shape';
import { filtersToParams, type SiteFilters } from '$lib/sites/filters';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site } from '../db/schema';
import { recordAudit } from './audit';
import type { DownloadFormat } from './downloads';
import { assertValidRegion, regionWhere } from './map';

/** Most sites one region download holds; beyond it the viewer draws a smaller region. */
export const MAX_REGION_DOWNLOAD_SITES = 100_000;

const { location: _location, ...siteColumns } = getTableColumns(site);

/**
 * The visible sites of a map region matching the map's filters, as a download with the citation
 * and licence of every dataset they come from. Sites come through visibleOnMaps (regionWhere), the
 * same rule as the map and its statistics, so the file holds exactly what the region panel
 * counted. One audit row (action `download`) per dataset, so each publisher sees the downloads of
 * its data.
 */
export async function regionDownload(
	db: Db,
	viewer: Viewer,
	region: Region,
	filters: SiteFilters,
	format: DownloadFormat,
	origin: string
) {
	await assertValidRegion(db, region);
	const rows: (ExportSite & { datasetId: string })[] = await db
		.select({
			...siteColumns,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(regionWhere(viewer, filters, region))
		.orderBy(asc(site.code), asc(site.id))
		.limit(MAX_REGION_DOWNLOAD_SITES + 1);
	if (rows.length > MAX_REGION_DOWNLOAD_SITES) {
		error(
			400,
			`the region holds more than ${MAX_REGION_DOWNLOAD_SITES.toLocaleString('en')} matching sites; draw a smaller region or narrow the filters`
		);
	}

	const perDataset = new Map<string, number>();
	for (const r of rows) perDataset.set(r.datasetId, (perDataset.get(r.datasetId) ?? 0) + 1);
	const found = perDataset.size
		? await db
				.select({ dataset, organisationName: organisation.name })
				.from(dataset)
				.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
				.where(inArray(dataset.id, [...perDataset.keys()]))
				.orderBy(asc(organisation.name), asc(dataset.title), asc(dataset.id))
		: [];
	const datasets: RegionDataset[] = found.map((f) => ({
		id: f.dataset.id,
		sites: perDataset.get(f.dataset.id) ?? 0,
		citation: citationFields(f.dataset, f.organisationName, origin)
	}));

	const about = {
		region:
			region.kind === 'bbox'
				? `bbox=${[region.box.west, region.box.south, region.box.east, region.box.north].join(',')}`
				: `polygon=${polygonToParam(region.ring)}`,
		filters: filtersToParams({ ...filters, page: 1 }).toString()
	};
	await db.transaction(async (tx) => {
		const base = { format, region: about.region, filters: about.filters, source: 'map-region' };
		if (!found.length) {
			await recordAudit(tx, viewer, {
				action: 'download',
				organisationId: null,
				datasetId: null,
				details: { ...base, sites: 0 }
			});
		}
		for (const f of found) {
			await recordAudit(tx, viewer, {
				action: 'download',
				organisationId: f.dataset.organisationId,
				datasetId: f.dataset.id,
				details: { ...base, sites: perDataset.get(f.dataset.id), version: f.dataset.version }
			});
		}
	});

	const body =
		format === 'csv'
			? regionCsv(rows, datasets, about)
			: JSON.stringify(regionGeoJson(rows, datasets, about), null, 1);
	const day = new Date().toISOString().slice(0, 10);
	return {
		body,
		headers: {
			'content-type':
				format === 'csv' ? 'text/csv; charset=utf-8' : 'application/geo+json; charset=utf-8',
			'content-disposition': `attachment; filename="region-sites-${day}.${format}"`,
			// What one viewer may download is not what the next may: never cache it in between.
			'cache-control': 'private, no-store'
		}
	};
}

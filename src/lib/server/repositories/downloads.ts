import { and, asc, eq, getTableColumns, sql } from 'drizzle-orm';
import { citationFields } from '$lib/datasets/citation';
import {
	downloadFileName,
	sitesCsv,
	sitesGeoJson,
	type ExportSite
} from '$lib/datasets/site-export';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, site } from '../db/schema';
import { recordAudit } from './audit';
import { datasetForViewer } from './datasets';

export type DownloadFormat = 'csv' | 'geojson';

const { location: _location, ...siteColumns } = getTableColumns(site);

/**
 * A dataset's sites as a download for whoever may see them (the access layer's condition on the
 * query itself, not only on the dataset), with its citation; the download is recorded in the
 * audit log (action `download`).
 */
export async function siteDownload(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	format: DownloadFormat,
	origin: string
) {
	const found = await datasetForViewer(db, viewer, datasetId);
	const rows: ExportSite[] = await db
		.select({
			...siteColumns,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(and(eq(site.datasetId, datasetId), visibleDatasets(viewer)))
		.orderBy(asc(site.code));
	const citation = citationFields(found.dataset, found.organisationName, origin);
	await recordAudit(db, viewer, {
		action: 'download',
		organisationId: found.dataset.organisationId,
		datasetId,
		details: { format, sites: rows.length, version: found.dataset.version }
	});
	const fileName = downloadFileName(found.dataset.title, found.dataset.version, format);
	const body =
		format === 'csv'
			? sitesCsv(rows, citation)
			: JSON.stringify(sitesGeoJson(rows, citation), null, 1);
	return {
		body,
		headers: {
			'content-type':
				format === 'csv' ? 'text/csv; charset=utf-8' : 'application/geo+json; charset=utf-8',
			'content-disposition': `attachment; filename="${fileName}"`,
			// RFC 8574: where the cited version lives.
			link: `<${citation.url}>; rel="cite-as"`,
			// What one viewer may download is not what the next may: never cache it in between.
			'cache-control': 'private, no-store'
		}
	};
}

import { and, asc, desc, eq, sql } from 'drizzle-orm';
import { datasetRights, notFound, requireUuid, visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import {
	attachment,
	conductivitySample,
	dataset,
	organisation,
	site,
	siteComputation,
	temperatureLog
} from '../db/schema';

/** A site the viewer may see, with its dataset and what they may do with it; the common 404 otherwise. */
export async function siteForViewer(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [row] = await db
		.select({
			site,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`,
			dataset,
			organisationName: organisation.name
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(site.id, id), visibleDatasets(viewer)));
	if (!row) notFound();
	return { ...row, ...datasetRights(viewer, row.dataset) };
}

/** Logs, conductivity samples, computations and files of a site, under the dataset visibility rule. */
export async function siteMeasurements(db: Db, viewer: Viewer, siteId: string) {
	requireUuid(siteId);
	const visibleSite = and(eq(site.id, siteId), visibleDatasets(viewer));
	const [logs, samples, computations, files] = await Promise.all([
		db
			.select({ log: temperatureLog })
			.from(temperatureLog)
			.innerJoin(site, eq(temperatureLog.siteId, site.id))
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(visibleSite)
			.orderBy(desc(temperatureLog.createdAt)),
		db
			.select({ sample: conductivitySample })
			.from(conductivitySample)
			.innerJoin(site, eq(conductivitySample.siteId, site.id))
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(visibleSite)
			.orderBy(asc(conductivitySample.topM)),
		db
			.select({ computation: siteComputation })
			.from(siteComputation)
			.innerJoin(site, eq(siteComputation.siteId, site.id))
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(visibleSite)
			.orderBy(desc(siteComputation.createdAt)),
		db
			.select({
				id: attachment.id,
				fileName: attachment.fileName,
				contentType: attachment.contentType,
				sizeBytes: attachment.sizeBytes,
				thumbnailKey: attachment.thumbnailKey
			})
			.from(attachment)
			.innerJoin(site, eq(attachment.siteId, site.id))
			.innerJoin(dataset, eq(site.datasetId, dataset.id))
			.where(and(visibleSite, eq(attachment.status, 'ready')))
			.orderBy(asc(attachment.fileName))
	]);
	return {
		logs: logs.map((r) => r.log),
		samples: samples.map((r) => r.sample),
		computations: computations.map((r) => r.computation),
		files: files.map(({ thumbnailKey, ...f }) => ({ ...f, hasThumbnail: Boolean(thumbnailKey) }))
	};
}

import { error } from '@sveltejs/kit';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import {
	attachment,
	conductivitySample,
	dataset,
	heatFlowComputation,
	site,
	temperatureLog
} from '../db/schema';
import { datasetForViewer } from './dataset-access';

/** A site the viewer may see, with its dataset's permissions; 404 otherwise (ids are not guessable hints). */
export async function siteForViewer(db: Db, viewer: Viewer, id: string) {
	if (!/^[0-9a-f-]{36}$/i.test(id)) error(404, 'No such site.');
	const [row] = await db
		.select({
			site,
			lon: sql<number>`ST_X(${site.location})`,
			lat: sql<number>`ST_Y(${site.location})`
		})
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(and(eq(site.id, id), visibleDatasets(viewer)));
	if (!row) error(404, 'No such site.');
	const owner = await datasetForViewer(db, viewer, row.site.datasetId);
	return {
		...row,
		dataset: owner.dataset,
		organisationName: owner.organisationName,
		can: owner.can,
		uploadRefusal: owner.uploadRefusal
	};
}

/** Logs, conductivity samples, computations and files of a site (the caller checked visibility). */
export async function siteMeasurements(db: Db, siteId: string) {
	const [logs, samples, computations, files] = await Promise.all([
		db
			.select()
			.from(temperatureLog)
			.where(eq(temperatureLog.siteId, siteId))
			.orderBy(desc(temperatureLog.createdAt)),
		db
			.select()
			.from(conductivitySample)
			.where(eq(conductivitySample.siteId, siteId))
			.orderBy(asc(conductivitySample.topM)),
		db
			.select()
			.from(heatFlowComputation)
			.where(eq(heatFlowComputation.siteId, siteId))
			.orderBy(desc(heatFlowComputation.createdAt)),
		db
			.select({
				id: attachment.id,
				fileName: attachment.fileName,
				contentType: attachment.contentType,
				sizeBytes: attachment.sizeBytes,
				thumbnailKey: attachment.thumbnailKey
			})
			.from(attachment)
			.where(and(eq(attachment.siteId, siteId), eq(attachment.status, 'ready')))
			.orderBy(asc(attachment.fileName))
	]);
	return { logs, samples, computations, files };
}

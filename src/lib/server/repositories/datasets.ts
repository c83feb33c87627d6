import { asc, count, eq } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site } from '../db/schema';

/** Datasets the viewer may see, with their organisation and number of sites. */
export async function listVisibleDatasets(db: Db, viewer: Viewer) {
	return db
		.select({
			id: dataset.id,
			title: dataset.title,
			licence: dataset.licence,
			version: dataset.version,
			visibility: dataset.visibility,
			embargoUntil: dataset.embargoUntil,
			organisationName: organisation.name,
			organisationSlug: organisation.slug,
			sites: count(site.id)
		})
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.leftJoin(site, eq(site.datasetId, dataset.id))
		.where(visibleDatasets(viewer))
		.groupBy(dataset.id, organisation.id)
		.orderBy(asc(dataset.title));
}

import { countDistinct, eq } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, site } from '../db/schema';

/** Counts of what the viewer may see, for the landing page. */
export async function visibleCounts(db: Db, viewer: Viewer) {
	const [row] = await db
		.select({
			sites: countDistinct(site.id),
			datasets: countDistinct(dataset.id),
			organisations: countDistinct(dataset.organisationId)
		})
		.from(dataset)
		.leftJoin(site, eq(site.datasetId, dataset.id))
		.where(visibleDatasets(viewer));
	return row;
}

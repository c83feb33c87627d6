import { count, countDistinct, eq } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation, site } from '../db/schema';

/**
 * Counts of what the viewer may see, for the landing page. Organisations are a public directory,
 * so their count is the length of the organisations list, not of those with visible datasets.
 */
export async function visibleCounts(db: Db, viewer: Viewer) {
	const [[row], [orgs]] = await Promise.all([
		db
			.select({ sites: countDistinct(site.id), datasets: countDistinct(dataset.id) })
			.from(dataset)
			.leftJoin(site, eq(site.datasetId, dataset.id))
			.where(visibleDatasets(viewer)),
		db.select({ organisations: count() }).from(organisation)
	]);
	return { ...row, organisations: orgs.organisations };
}

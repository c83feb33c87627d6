import { error } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { conductivitySample, temperatureLog } from '../db/schema';
import { siteForViewer } from './site-detail';

declare const editable: unique symbol;
/** A site the viewer was found allowed to change; only `editableSite` makes one. */
export type EditableSite = Awaited<ReturnType<typeof siteForViewer>> & { [editable]: true };

/** The site, if the viewer may add data to it now (upload right, confirmed address); 404/403 otherwise. */
export async function editableSite(db: Db, viewer: Viewer, id: string): Promise<EditableSite> {
	const found = await siteForViewer(db, viewer, id);
	if (!found.can.upload) error(403, found.uploadRefusal ?? 'You may not change this site.');
	return found as EditableSite;
}

export async function addTemperatureLog(
	db: Db,
	viewer: Viewer,
	target: EditableSite,
	log: { name: string; sourceFileName: string; depthM: number[]; temperatureC: number[] }
) {
	await db
		.insert(temperatureLog)
		.values({ ...log, siteId: target.site.id, createdBy: viewer.userId });
}

/** A new conductivity file replaces the site's samples, in one transaction. */
export async function replaceConductivitySamples(
	db: Db,
	target: EditableSite,
	intervals: { topM: number; bottomM: number; conductivityWmK: number; sigmaWmK?: number | null }[]
) {
	await db.transaction(async (tx) => {
		await tx.delete(conductivitySample).where(eq(conductivitySample.siteId, target.site.id));
		await tx.insert(conductivitySample).values(
			intervals.map((i) => ({
				siteId: target.site.id,
				topM: i.topM,
				bottomM: i.bottomM,
				conductivityWmK: i.conductivityWmK,
				sigmaWmK: i.sigmaWmK ?? null
			}))
		);
	});
}

/** A heat flow computed from a log (stored by recordHeatFlowComputation in site-values.ts). */
export interface ComputedHeatFlow {
	logId: string;
	method: 'interval' | 'bullard';
	fromM: number;
	toM: number;
	heatFlowMWm2: number;
	sigmaMWm2: number;
	gradientKPerKm: number;
	sigmaGradientKPerKm: number;
	meanConductivityWmK: number;
	samples: number;
	engineVersion: string;
}

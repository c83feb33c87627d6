import { error } from '@sveltejs/kit';
import { and, asc, eq, gte, isNotNull, lte } from 'drizzle-orm';
import { qualityClass } from '$lib/sites/quality';
import { pickSiteValues, type RevisionRecord, type SiteValues } from '$lib/sites/revisions';
import type { SiteComputationKind } from '$lib/sites/computations';
import { requireUuid, visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import {
	dataset,
	importBatch,
	site,
	siteComputation,
	siteValueRevision,
	temperatureLog,
	user
} from '../db/schema';
import { recordAudit, type DbOrTx } from './audit';
import type { ComputedHeatFlow, EditableSite } from './site-data';

/** Audit actions written here (audit_event.action is free text; these are this module's names). */
export const SITE_VALUE_AUDIT_ACTIONS = [
	'site_values_revision',
	'site_values_current',
	'site_computation'
] as const;

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * Locks the site row for this transaction and checks that its dataset is still in the state the
 * rights were checked in (a concurrent submit or publish wins; same rule as dataset edits).
 */
async function lockSite(tx: Tx, target: EditableSite) {
	const [row] = await tx
		.select({ site, status: dataset.status })
		.from(site)
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.where(eq(site.id, target.site.id))
		.for('update', { of: site });
	if (!row || row.status !== target.dataset.status)
		error(409, 'The dataset changed state meanwhile; reload the page and try again.');
	return row.site;
}

/**
 * The values as submitted become a revision the first time anything else is added (under the
 * site lock, so they are read before any change). The import that stored them is the dataset's
 * finished import whose run covers the site's creation time, when exactly one does.
 */
async function ensureSubmittedRevision(tx: Tx, s: typeof site.$inferSelect) {
	const [existing] = await tx
		.select({ id: siteValueRevision.id })
		.from(siteValueRevision)
		.where(and(eq(siteValueRevision.siteId, s.id), eq(siteValueRevision.source, 'submitted')));
	if (existing) return existing.id;
	const batches = await tx
		.select({ id: importBatch.id, createdBy: importBatch.createdBy })
		.from(importBatch)
		.where(
			and(
				eq(importBatch.datasetId, s.datasetId),
				eq(importBatch.status, 'done'),
				lte(importBatch.createdAt, s.createdAt),
				isNotNull(importBatch.finishedAt),
				gte(importBatch.finishedAt, s.createdAt)
			)
		)
		.limit(2);
	const batch = batches.length === 1 ? batches[0] : null;
	const [created] = await tx
		.insert(siteValueRevision)
		.values({
			...pickSiteValues(s),
			siteId: s.id,
			source: 'submitted',
			importBatchId: batch?.id ?? null,
			createdBy: batch?.createdBy ?? null,
			createdAt: s.createdAt
		})
		.returning({ id: siteValueRevision.id });
	return created.id;
}

async function audit(
	tx: DbOrTx,
	viewer: Viewer,
	target: EditableSite,
	action: string,
	details: Record<string, unknown>
) {
	await recordAudit(tx, viewer, {
		action,
		organisationId: target.dataset.organisationId,
		datasetId: target.dataset.id,
		details: { siteId: target.site.id, siteCode: target.site.code, ...details }
	});
}

/**
 * Store a heat flow computed from a log; with `keep`, also as a new revision of the site's values
 * beside the submitted one. The site's current values do not change (choose a revision for that).
 */
export async function recordHeatFlowComputation(
	db: Db,
	viewer: Viewer,
	target: EditableSite,
	c: ComputedHeatFlow,
	keep: { conductivitySamples: number; sigmaMeanConductivityWmK: number } | null
): Promise<{ computationId: string; revisionId: string | null }> {
	return db.transaction(async (tx) => {
		const locked = await lockSite(tx, target);
		const [computation] = await tx
			.insert(siteComputation)
			.values({
				...c,
				kind: 'heat_flow',
				inputs: { logId: c.logId, method: c.method, fromM: c.fromM, toM: c.toM },
				siteId: target.site.id,
				createdBy: viewer.userId
			})
			.returning({ id: siteComputation.id });
		if (!keep) return { computationId: computation.id, revisionId: null };
		await ensureSubmittedRevision(tx, locked);
		const [revision] = await tx
			.insert(siteValueRevision)
			.values({
				siteId: target.site.id,
				source: 'log_computation',
				heatFlowMWm2: c.heatFlowMWm2,
				heatFlowSigmaMWm2: c.sigmaMWm2,
				gradientKPerKm: c.gradientKPerKm,
				gradientSigmaKPerKm: c.sigmaGradientKPerKm,
				conductivityWmK: c.meanConductivityWmK,
				conductivitySigmaWmK: keep.sigmaMeanConductivityWmK,
				conductivitySamples: keep.conductivitySamples,
				topDepthM: c.fromM,
				bottomDepthM: c.toM,
				method: c.method === 'bullard' ? 'bullard' : 'borehole_interval',
				computationId: computation.id,
				createdBy: viewer.userId
			})
			.returning({ id: siteValueRevision.id });
		await audit(tx, viewer, target, 'site_values_revision', {
			revisionId: revision.id,
			source: 'log_computation',
			heatFlowMWm2: c.heatFlowMWm2
		});
		return { computationId: computation.id, revisionId: revision.id };
	});
}

/** A manual correction of the site's values, with its reason, as a new (not yet current) revision. */
export async function addCorrection(
	db: Db,
	viewer: Viewer,
	target: EditableSite,
	values: Omit<SiteValues, 'conductivitySamples'>,
	reason: string
): Promise<string> {
	return db.transaction(async (tx) => {
		const locked = await lockSite(tx, target);
		await ensureSubmittedRevision(tx, locked);
		const [revision] = await tx
			.insert(siteValueRevision)
			.values({
				...values,
				// Samples behind the conductivity are not re-entered by hand; keep the current count.
				conductivitySamples: locked.conductivitySamples,
				siteId: target.site.id,
				source: 'correction',
				reason,
				createdBy: viewer.userId
			})
			.returning({ id: siteValueRevision.id });
		await audit(tx, viewer, target, 'site_values_revision', {
			revisionId: revision.id,
			source: 'correction',
			reason
		});
		return revision.id;
	});
}

/**
 * Make one of the site's revisions current: its values are copied onto the site (which the map,
 * filters and APIs read) and the quality class is recomputed, in one transaction. False when the
 * revision does not belong to the site.
 */
export async function chooseCurrentRevision(
	db: Db,
	viewer: Viewer,
	target: EditableSite,
	revisionId: string
): Promise<boolean> {
	requireUuid(revisionId);
	return db.transaction(async (tx) => {
		await lockSite(tx, target);
		const [r] = await tx
			.select()
			.from(siteValueRevision)
			.where(
				and(eq(siteValueRevision.id, revisionId), eq(siteValueRevision.siteId, target.site.id))
			);
		if (!r) return false;
		const values = pickSiteValues(r);
		await tx
			.update(site)
			.set({
				...values,
				currentRevisionId: r.id,
				qualityClass:
					values.heatFlowMWm2 === null
						? null
						: qualityClass({
								heatFlowMWm2: values.heatFlowMWm2,
								heatFlowSigmaMWm2: values.heatFlowSigmaMWm2,
								method: values.method,
								conductivitySamples: values.conductivitySamples
							}),
				updatedAt: new Date()
			})
			.where(eq(site.id, target.site.id));
		await audit(tx, viewer, target, 'site_values_current', {
			revisionId: r.id,
			source: r.source,
			heatFlowMWm2: r.heatFlowMWm2
		});
		return true;
	});
}

/** A Horner, palaeoclimate or heat-production computation, stored with its inputs and result. */
export async function recordSiteComputation(
	db: Db,
	viewer: Viewer,
	target: EditableSite,
	kind: Exclude<SiteComputationKind, 'heat_flow'>,
	inputs: Record<string, unknown>,
	result: Record<string, unknown>,
	engineVersion: string,
	/** A log made by the computation (the palaeoclimate-corrected log), stored in the same transaction. */
	newLog?: { name: string; depthM: number[]; temperatureC: number[]; logId: string }
): Promise<string> {
	return db.transaction(async (tx) => {
		await lockSite(tx, target);
		let stored = result;
		if (newLog) {
			const [log] = await tx
				.insert(temperatureLog)
				.values({
					siteId: target.site.id,
					name: newLog.name,
					sourceFileName: null,
					depthM: newLog.depthM,
					temperatureC: newLog.temperatureC,
					createdBy: viewer.userId
				})
				.returning({ id: temperatureLog.id });
			stored = { ...result, correctedLogId: log.id };
		}
		const [row] = await tx
			.insert(siteComputation)
			.values({
				siteId: target.site.id,
				kind,
				logId: newLog?.logId ?? null,
				inputs,
				result: stored,
				engineVersion,
				createdBy: viewer.userId
			})
			.returning({ id: siteComputation.id });
		await audit(tx, viewer, target, 'site_computation', { computationId: row.id, kind });
		return row.id;
	});
}

/** The site's revisions with their provenance, under the dataset visibility rule. */
export async function siteRevisions(
	db: Db,
	viewer: Viewer,
	siteId: string
): Promise<RevisionRecord[]> {
	requireUuid(siteId);
	const rows = await db
		.select({
			r: siteValueRevision,
			createdByName: user.name,
			importFileName: importBatch.fileName,
			computation: {
				method: siteComputation.method,
				fromM: siteComputation.fromM,
				toM: siteComputation.toM
			},
			logName: temperatureLog.name
		})
		.from(siteValueRevision)
		.innerJoin(site, eq(siteValueRevision.siteId, site.id))
		.innerJoin(dataset, eq(site.datasetId, dataset.id))
		.leftJoin(user, eq(siteValueRevision.createdBy, user.id))
		.leftJoin(importBatch, eq(siteValueRevision.importBatchId, importBatch.id))
		.leftJoin(siteComputation, eq(siteValueRevision.computationId, siteComputation.id))
		.leftJoin(temperatureLog, eq(siteComputation.logId, temperatureLog.id))
		.where(and(eq(site.id, siteId), visibleDatasets(viewer)))
		.orderBy(asc(siteValueRevision.createdAt));
	return rows.map(({ r, createdByName, importFileName, computation, logName }) => ({
		...pickSiteValues(r),
		id: r.id,
		source: r.source,
		createdAt: r.createdAt,
		createdByName,
		reason: r.reason,
		importFileName,
		computation:
			computation?.method && computation.fromM !== null && computation.toM !== null
				? { method: computation.method, fromM: computation.fromM, toM: computation.toM, logName }
				: null
	}));
}

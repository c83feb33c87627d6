import { error } from '@sveltejs/kit';
import { and, asc, count, desc, eq, inArray, isNull, notInArray } from 'drizzle-orm';
import {
	datasetRights,
	notFound,
	organisationsWhere,
	requireUuid,
	visibleDatasets,
	visibleImports,
	type Viewer
} from '../access';
import type { Db } from '../db/client';
import {
	attachment,
	dataset,
	importBatch,
	organisation,
	site,
	type NewDataset
} from '../db/schema';
import { recordAudit } from './audit';

/** Datasets the viewer may see, with their organisation, state and number of sites. */
export async function listVisibleDatasets(db: Db, viewer: Viewer) {
	return db
		.select({
			id: dataset.id,
			title: dataset.title,
			licence: dataset.licence,
			version: dataset.version,
			status: dataset.status,
			visibility: dataset.visibility,
			embargoUntil: dataset.embargoUntil,
			supersededById: dataset.supersededById,
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

/** The datasets of one organisation the viewer may see (organisation page). */
export async function listOrganisationDatasets(db: Db, viewer: Viewer, organisationId: string) {
	return db
		.select({
			id: dataset.id,
			title: dataset.title,
			status: dataset.status,
			visibility: dataset.visibility,
			embargoUntil: dataset.embargoUntil,
			supersededById: dataset.supersededById
		})
		.from(dataset)
		.where(and(eq(dataset.organisationId, organisationId), visibleDatasets(viewer)))
		.orderBy(asc(dataset.title));
}

/**
 * A dataset the viewer may see, with their role in its organisation (null if not a member) and
 * what they may do with it (access/rights.ts). The one 404 of the access layer when it does not
 * exist or is not visible to them, so hidden datasets cannot be discovered by guessing ids.
 */
export async function datasetForViewer(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [row] = await db
		.select({ dataset, organisationName: organisation.name, organisationSlug: organisation.slug })
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(dataset.id, id), visibleDatasets(viewer)));
	if (!row) notFound();
	return { ...row, ...datasetRights(viewer, row.dataset) };
}

export type VisibleDataset = Awaited<ReturnType<typeof datasetForViewer>>;

/** Files attached to the dataset itself (not to one site), ready ones only. */
export async function listDatasetFiles(db: Db, viewer: Viewer, datasetId: string) {
	requireUuid(datasetId);
	const rows = await db
		.select({
			id: attachment.id,
			fileName: attachment.fileName,
			contentType: attachment.contentType,
			sizeBytes: attachment.sizeBytes,
			thumbnailKey: attachment.thumbnailKey
		})
		.from(attachment)
		.innerJoin(dataset, eq(attachment.datasetId, dataset.id))
		.where(
			and(
				eq(attachment.datasetId, datasetId),
				isNull(attachment.siteId),
				eq(attachment.status, 'ready'),
				visibleDatasets(viewer)
			)
		)
		.orderBy(asc(attachment.fileName));
	return rows.map(({ thumbnailKey, ...f }) => ({ ...f, hasThumbnail: Boolean(thumbnailKey) }));
}

/** The latest imports into a dataset, for those who may see its import history. */
export async function listDatasetImports(db: Db, viewer: Viewer, datasetId: string, limit = 20) {
	requireUuid(datasetId);
	return db
		.select({
			id: importBatch.id,
			fileName: importBatch.fileName,
			totalRows: importBatch.totalRows,
			status: importBatch.status,
			error: importBatch.error,
			createdAt: importBatch.createdAt
		})
		.from(importBatch)
		.innerJoin(dataset, eq(importBatch.datasetId, dataset.id))
		.where(and(eq(importBatch.datasetId, datasetId), visibleImports(viewer)))
		.orderBy(desc(importBatch.createdAt))
		.limit(limit);
}

/** One import's progress, under the same rule as the import history; 404 otherwise. */
export async function importForViewer(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [batch] = await db
		.select({
			id: importBatch.id,
			status: importBatch.status,
			totalRows: importBatch.totalRows,
			doneRows: importBatch.doneRows,
			error: importBatch.error,
			datasetId: importBatch.datasetId
		})
		.from(importBatch)
		.innerJoin(dataset, eq(importBatch.datasetId, dataset.id))
		.where(and(eq(importBatch.id, id), visibleImports(viewer)));
	if (!batch) notFound();
	return batch;
}

/** Organisations in which the viewer's role may create datasets, by name. */
export async function creatableOrganisations(db: Db, viewer: Viewer) {
	const ids = organisationsWhere(viewer, 'dataset', 'create');
	if (ids.length === 0) return [];
	return db
		.select({ id: organisation.id, name: organisation.name })
		.from(organisation)
		.where(inArray(organisation.id, ids))
		.orderBy(asc(organisation.name));
}

export type DatasetFields = Omit<
	NewDataset,
	'id' | 'organisationId' | 'status' | 'createdBy' | 'updatedBy' | 'createdAt' | 'updatedAt'
>;

/** A new draft in an organisation where the viewer may create datasets; null when they may not. */
export async function createDraftDataset(
	db: Db,
	viewer: Viewer,
	input: DatasetFields & { organisationId: string }
): Promise<string | null> {
	if (
		!viewer.userId ||
		!organisationsWhere(viewer, 'dataset', 'create').includes(input.organisationId)
	)
		return null;
	return db.transaction(async (tx) => {
		const [created] = await tx
			.insert(dataset)
			.values({ ...input, status: 'draft', createdBy: viewer.userId, updatedBy: viewer.userId })
			.returning({ id: dataset.id });
		await recordAudit(tx, viewer, {
			action: 'create',
			organisationId: input.organisationId,
			datasetId: created.id,
			details: { title: input.title }
		});
		return created.id;
	});
}

/** Save metadata of a dataset the viewer may edit now (the caller got `found` from datasetForViewer). */
export async function updateDatasetMetadata(
	db: Db,
	viewer: Viewer,
	found: VisibleDataset,
	fields: DatasetFields
): Promise<boolean> {
	if (!found.can.editMetadata) return false;
	const before = found.dataset as Record<string, unknown>;
	const changed = Object.keys(fields).filter(
		(k) =>
			JSON.stringify(before[k] ?? null) !== JSON.stringify(fields[k as keyof DatasetFields] ?? null)
	);
	return db.transaction(async (tx) => {
		const updated = await tx
			.update(dataset)
			// Only while the state it was checked in holds: a concurrent submit or publish wins.
			.set({ ...fields, updatedBy: viewer.userId, updatedAt: new Date() })
			.where(and(eq(dataset.id, found.dataset.id), eq(dataset.status, found.dataset.status)))
			.returning({ id: dataset.id });
		if (updated.length !== 1) return false;
		await recordAudit(tx, viewer, {
			action: 'edit',
			organisationId: found.dataset.organisationId,
			datasetId: found.dataset.id,
			details: { fields: changed }
		});
		return true;
	});
}

export const DELETE_PUBLISHED_REFUSAL =
	'A dataset that has been published is never deleted: it stays citable. Retire it instead. Nothing was changed.';

/**
 * Delete a dataset that was never published (a draft, or a correction nobody wants), with its
 * sites. Published and retired versions are refused (retire them); so are datasets that still
 * hold files (their stored bytes are removed one by one with the file delete).
 */
export async function deleteUnpublishedDataset(db: Db, viewer: Viewer, id: string) {
	const found = await datasetForViewer(db, viewer, id);
	const d = found.dataset;
	if (d.status === 'published' || d.status === 'retired') error(403, DELETE_PUBLISHED_REFUSAL);
	if (!found.can.deleteDataset)
		error(
			403,
			'Only curators and owners of its organisation may delete a dataset. Nothing was changed.'
		);
	const [files] = await db
		.select({ n: count() })
		.from(attachment)
		.where(eq(attachment.datasetId, id));
	if (files.n > 0) error(409, 'Delete its files first, then the dataset. Nothing was changed.');
	const deleted = await db.transaction(async (tx) => {
		const rows = await tx
			.delete(dataset)
			.where(and(eq(dataset.id, id), notInArray(dataset.status, ['published', 'retired'])))
			.returning({ id: dataset.id });
		if (rows.length !== 1) return false;
		await recordAudit(tx, viewer, {
			action: 'delete',
			organisationId: d.organisationId,
			datasetId: id,
			details: { title: d.title, version: d.version }
		});
		return true;
	});
	if (!deleted) error(403, DELETE_PUBLISHED_REFUSAL);
	return { organisationSlug: found.organisationSlug, previousVersionId: d.previousVersionId };
}

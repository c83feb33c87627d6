import { error, fail } from '@sveltejs/kit';
import { and, desc, eq, isNull } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { attachment, dataset, importBatch } from '$lib/server/db/schema';
import { requireUser } from '$lib/server/guards';
import { datasetForViewer } from '$lib/server/repositories/dataset-access';
import { listDatasetSites } from '$lib/server/repositories/site-list';
import { parseForm } from '$lib/schemas/form';
import { datasetSchema } from '$lib/schemas/dataset';
import { parseSiteListQuery } from '$lib/sites/list-query';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals, url }) => {
	const db = getDb();
	const found = await datasetForViewer(db, locals.viewer, params.id);
	const query = parseSiteListQuery(url.searchParams);
	const [sites, files, imports] = await Promise.all([
		listDatasetSites(db, locals.viewer, params.id, query),
		db
			.select({
				id: attachment.id,
				fileName: attachment.fileName,
				contentType: attachment.contentType,
				sizeBytes: attachment.sizeBytes,
				hasThumbnail: attachment.thumbnailKey
			})
			.from(attachment)
			.where(
				and(
					eq(attachment.datasetId, params.id),
					isNull(attachment.siteId),
					eq(attachment.status, 'ready')
				)
			)
			.orderBy(attachment.fileName),
		found.can.readPrivate
			? db
					.select({
						id: importBatch.id,
						fileName: importBatch.fileName,
						totalRows: importBatch.totalRows,
						status: importBatch.status,
						error: importBatch.error,
						createdAt: importBatch.createdAt
					})
					.from(importBatch)
					.where(eq(importBatch.datasetId, params.id))
					.orderBy(desc(importBatch.createdAt))
					.limit(20)
			: Promise.resolve([])
	]);
	return {
		dataset: found.dataset,
		organisationName: found.organisationName,
		organisationSlug: found.organisationSlug,
		can: found.can,
		query,
		sites,
		files: files.map((f) => ({ ...f, hasThumbnail: Boolean(f.hasThumbnail) })),
		imports
	};
};

export const actions: Actions = {
	update: async (event) => {
		const user = requireUser(event, 'action');
		const db = getDb();
		const found = await datasetForViewer(db, event.locals.viewer, event.params.id);
		if (!found.can.editMetadata) error(403, 'Your role does not allow editing this dataset now.');
		const parsed = parseForm(datasetSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, parsed);
		await db
			.update(dataset)
			.set({ ...parsed.data, updatedBy: user.id, updatedAt: new Date() })
			.where(eq(dataset.id, event.params.id));
		return { saved: true };
	}
};

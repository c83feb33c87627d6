import { error, fail } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import {
	datasetForViewer,
	listDatasetFiles,
	listDatasetImports,
	updateDatasetMetadata
} from '$lib/server/repositories/datasets';
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
		listDatasetFiles(db, locals.viewer, params.id),
		listDatasetImports(db, locals.viewer, params.id)
	]);
	return {
		dataset: found.dataset,
		organisationName: found.organisationName,
		organisationSlug: found.organisationSlug,
		can: found.can,
		query,
		sites,
		files,
		imports
	};
};

export const actions: Actions = {
	update: async (event) => {
		requireUser(event, 'action');
		const db = getDb();
		const found = await datasetForViewer(db, event.locals.viewer, event.params.id);
		if (!found.can.editMetadata) error(403, 'Your role does not allow editing this dataset now.');
		const parsed = parseForm(datasetSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, parsed);
		if (!(await updateDatasetMetadata(db, event.locals.viewer, found, parsed.data)))
			error(403, 'The dataset changed state meanwhile; nothing was saved. Reload the page.');
		return { saved: true };
	}
};

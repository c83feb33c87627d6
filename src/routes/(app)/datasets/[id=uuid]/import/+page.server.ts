import { getDb } from '$lib/server/db';
import { requireUpload, requireUser } from '$lib/server/guards';
import { datasetForViewer } from '$lib/server/repositories/datasets';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	const found = await datasetForViewer(getDb(), event.locals.viewer, event.params.id);
	requireUpload(found);
	return { dataset: { id: found.dataset.id, title: found.dataset.title } };
};

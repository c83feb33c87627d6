import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { datasetForViewer, requireUpload } from '$lib/server/repositories/dataset-access';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireUser(event);
	const found = await datasetForViewer(getDb(), event.locals.viewer, event.params.id);
	requireUpload(found);
	return { dataset: { id: found.dataset.id, title: found.dataset.title } };
};

import { error } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { datasetForViewer } from '$lib/server/repositories/dataset-access';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const found = await datasetForViewer(getDb(), event.locals.viewer, event.params.id);
	if (!found.can.upload) error(403, 'Your role does not allow adding sites to this dataset now.');
	return {
		dataset: { id: found.dataset.id, title: found.dataset.title },
		verified: user.emailVerified
	};
};

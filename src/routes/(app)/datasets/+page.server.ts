import { getDb } from '$lib/server/db';
import { listVisibleDatasets } from '$lib/server/repositories/datasets';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	datasets: await listVisibleDatasets(getDb(), locals.viewer)
});

import { getDb } from '$lib/server/db';
import { visibleCounts } from '$lib/server/repositories/stats';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	return { counts: await visibleCounts(getDb(), locals.viewer) };
};

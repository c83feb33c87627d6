import { z } from 'zod';
import { STATUS_LABELS } from '$lib/datasets/status';
import { getDb } from '$lib/server/db';
import { listVisibleDatasets } from '$lib/server/repositories/datasets';
import type { PageServerLoad } from './$types';

const statusFilter = z.enum(Object.keys(STATUS_LABELS) as [string, ...string[]]);

export const load: PageServerLoad = async ({ locals, url }) => {
	const asked = url.searchParams.get('status');
	const parsed = asked ? statusFilter.safeParse(asked) : null;
	const status = parsed?.success ? parsed.data : null;
	const all = await listVisibleDatasets(getDb(), locals.viewer);
	return {
		datasets: status ? all.filter((d) => d.status === status) : all,
		total: all.length,
		status,
		statusProblem:
			asked && !status ? `There is no status “${asked.slice(0, 40)}”: showing all.` : null
	};
};

import { z } from 'zod';
import { STATUS_LABELS } from '$lib/datasets/status';
import { getDb } from '$lib/server/db';
import { listVisibleDatasets } from '$lib/server/repositories/datasets';
import { listCatalogueEntries } from '$lib/server/repositories/sharing';
import type { PageServerLoad } from './$types';

const statusFilter = z.enum(Object.keys(STATUS_LABELS) as [string, ...string[]]);

export const load: PageServerLoad = async ({ locals, url }) => {
	const asked = url.searchParams.get('status');
	const parsed = asked ? statusFilter.safeParse(asked) : null;
	const status = parsed?.success ? parsed.data : null;
	const [all, listed] = await Promise.all([
		listVisibleDatasets(getDb(), locals.viewer),
		// Restricted and embargoed datasets the viewer may not open: found here, asked for there.
		listCatalogueEntries(getDb(), locals.viewer)
	]);
	return {
		catalogue: status && status !== 'published' ? [] : listed,
		datasets: status ? all.filter((d) => d.status === status) : all,
		total: all.length,
		status,
		statusProblem:
			asked && !status ? `There is no status “${asked.slice(0, 40)}”: showing all.` : null
	};
};

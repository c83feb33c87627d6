import { and, eq } from 'drizzle-orm';
import { visibleDatasets } from '$lib/server/access';
import { getDb } from '$lib/server/db';
import { dataset } from '$lib/server/db/schema';
import { organisationAndMembership } from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals }) => {
	const { org, membership } = await organisationAndMembership(params.slug, locals.user?.id ?? null);
	const datasets = await getDb()
		.select({
			id: dataset.id,
			title: dataset.title,
			status: dataset.status,
			visibility: dataset.visibility
		})
		.from(dataset)
		.where(and(eq(dataset.organisationId, org.id), visibleDatasets(locals.viewer)))
		.orderBy(dataset.title);
	return {
		organisation: {
			name: org.name,
			slug: org.slug,
			country: org.country,
			website: org.website,
			description: org.description
		},
		role: membership?.role ?? null,
		datasets
	};
};

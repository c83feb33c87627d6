import { getDb } from '$lib/server/db';
import { organisationAndMembership } from '$lib/server/guards';
import { listOrganisationDatasets } from '$lib/server/repositories/datasets';
import {
	listCatalogueEntries,
	pendingRequestsOfOrganisation
} from '$lib/server/repositories/sharing';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { org, membership } = await organisationAndMembership(event, event.params.slug);
	return {
		organisation: {
			name: org.name,
			slug: org.slug,
			country: org.country,
			website: org.website,
			description: org.description
		},
		role: membership?.role ?? null,
		datasets: await listOrganisationDatasets(getDb(), event.locals.viewer, org.id),
		// Its restricted and embargoed datasets the viewer may not open: title and "ask for access".
		catalogue: await listCatalogueEntries(getDb(), event.locals.viewer, org.id),
		// Datasets with access requests waiting (empty unless the viewer answers them).
		accessRequests: await pendingRequestsOfOrganisation(getDb(), event.locals.viewer, org.id)
	};
};

import { getDb } from '$lib/server/db';
import { listOrganisations } from '$lib/server/repositories/organisations';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => ({
	organisations: await listOrganisations(getDb(), locals.viewer)
});

import { fail, redirect } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { mailTemplates } from '$lib/server/mail-templates';
import { catalogueEntry, requestAccess, seesWholeDataset } from '$lib/server/repositories/sharing';
import { datasetUrl, mailSharing } from '$lib/server/sharing-mail';
import { parseForm } from '$lib/schemas/form';
import { accessRequestSchema } from '$lib/schemas/sharing';
import type { Actions, PageServerLoad } from './$types';

/**
 * The public catalogue entry of a restricted or embargoed dataset (access/visibility.ts,
 * `catalogueEntries`) and the form to ask for access. Whoever may see it whole goes to its page.
 */
export const load: PageServerLoad = async ({ params, locals }) => {
	const db = getDb();
	if (await seesWholeDataset(db, locals.viewer, params.id)) redirect(303, `/datasets/${params.id}`);
	return {
		entry: await catalogueEntry(db, locals.viewer, params.id),
		signedIn: Boolean(locals.user)
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireUser(event, 'action');
		const parsed = parseForm(accessRequestSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, parsed);
		const db = getDb();
		const { entry, notify } = await requestAccess(
			db,
			event.locals.viewer,
			event.params.id,
			parsed.data.purpose
		);
		await mailSharing(
			notify,
			mailTemplates.accessRequested(
				entry.dataset,
				`${user.name} <${user.email}>`,
				parsed.data.purpose,
				datasetUrl(entry.dataset.id)
			),
			`access request on dataset ${entry.dataset.id}`
		);
		return { requested: true };
	}
};

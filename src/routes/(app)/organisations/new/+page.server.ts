import { fail, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { requireUser } from '$lib/server/guards';
import { parseForm } from '$lib/schemas/form';
import { organisationSchema } from '$lib/schemas/organisation';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	// The rule itself is enforced by better-auth (allowUserToCreateOrganization); this only
	// lets the page say so before the form is filled in.
	return { verified: requireUser(event).emailVerified };
};

export const actions: Actions = {
	default: async (event) => {
		requireUser(event, 'action');
		const parsed = parseForm(organisationSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, parsed);
		try {
			await auth().api.createOrganization({ body: parsed.data, headers: event.request.headers });
		} catch (err) {
			return authFailure(err, { values: parsed.data });
		}
		redirect(303, `/organisations/${parsed.data.slug}/settings`);
	}
};

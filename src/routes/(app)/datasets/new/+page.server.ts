import { error, fail, redirect } from '@sveltejs/kit';
import { embargoDateRefusal } from '$lib/server/access';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { createDraftDataset, creatableOrganisations } from '$lib/server/repositories/datasets';
import { formValues, parseForm } from '$lib/schemas/form';
import { newDatasetSchema } from '$lib/schemas/dataset';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return {
		organisations: await creatableOrganisations(getDb(), event.locals.viewer),
		verified: user.emailVerified
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireUser(event, 'action');
		if (!user.emailVerified) error(403, 'Confirm your e-mail address before you create datasets.');
		const formData = await event.request.formData();
		const parsed = parseForm(newDatasetSchema, formData);
		if (!parsed.ok) return fail(400, parsed);
		const embargoRefusal = embargoDateRefusal(null, parsed.data);
		if (embargoRefusal)
			return fail(400, { errors: { embargoUntil: embargoRefusal }, values: formValues(formData) });
		const id = await createDraftDataset(getDb(), event.locals.viewer, parsed.data);
		if (!id) error(403, 'Your role in that organisation does not allow creating datasets.');
		redirect(303, `/datasets/${id}`);
	}
};

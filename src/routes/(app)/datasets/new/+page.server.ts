import { error, fail, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { dataset, member, organisation } from '$lib/server/db/schema';
import { requireUser } from '$lib/server/guards';
import { roleCan } from '$lib/server/permissions';
import { parseForm } from '$lib/schemas/form';
import { newDatasetSchema } from '$lib/schemas/dataset';
import type { Actions, PageServerLoad } from './$types';

/** Organisations in which the user's role may create datasets. */
async function creatableOrganisations(userId: string) {
	const rows = await getDb()
		.select({ id: organisation.id, name: organisation.name, role: member.role })
		.from(member)
		.innerJoin(organisation, eq(member.organizationId, organisation.id))
		.where(eq(member.userId, userId));
	return rows.filter((r) => roleCan(r.role, 'dataset', 'create'));
}

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	return {
		organisations: (await creatableOrganisations(user.id)).map(({ id, name }) => ({ id, name })),
		verified: user.emailVerified
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = requireUser(event, 'action');
		if (!user.emailVerified) error(403, 'Confirm your e-mail address before you create datasets.');
		const parsed = parseForm(newDatasetSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, parsed);
		const allowed = await creatableOrganisations(user.id);
		if (!allowed.some((o) => o.id === parsed.data.organisationId)) {
			error(403, 'Your role in that organisation does not allow creating datasets.');
		}
		const [created] = await getDb()
			.insert(dataset)
			.values({ ...parsed.data, status: 'draft', createdBy: user.id, updatedBy: user.id })
			.returning({ id: dataset.id });
		redirect(303, `/datasets/${created.id}`);
	}
};

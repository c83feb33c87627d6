import { fail, type RequestEvent } from '@sveltejs/kit';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { mailTemplates } from '$lib/server/mail-templates';
import { datasetForViewer } from '$lib/server/repositories/datasets';
import { answerRequest, grantAccess, revokeGrant } from '$lib/server/repositories/sharing';
import { datasetUrl, mailSharing } from '$lib/server/sharing-mail';
import { parseForm } from '$lib/schemas/form';
import {
	approveRequestSchema,
	declineRequestSchema,
	grantSchema,
	revokeSchema
} from '$lib/schemas/sharing';

/**
 * The dataset page's sharing actions (answer a request, grant, revoke). The repository checks the
 * role and the dataset's state (403 with a sentence, nothing changed); both sides are mailed once
 * the change is committed.
 */
type Event = RequestEvent<{ id: string }>;

async function setUp(event: Event) {
	requireUser(event, 'action');
	const db = getDb();
	const found = await datasetForViewer(db, event.locals.viewer, event.params.id);
	return { db, found, form: await event.request.formData() };
}

export const sharingActions = {
	approve: async (event: Event) => {
		const { db, found, form } = await setUp(event);
		const parsed = parseForm(approveRequestSchema, form);
		if (!parsed.ok) return fail(400, { ...parsed, form: 'sharing' });
		const { request, requester } = await answerRequest(
			db,
			event.locals.viewer,
			found,
			parsed.data.requestId,
			{ approve: true, expiresOn: parsed.data.expiresOn }
		);
		await mailSharing(
			[requester],
			mailTemplates.accessGranted(
				found.dataset,
				parsed.data.expiresOn,
				datasetUrl(found.dataset.id)
			),
			`grant for request ${request.id}`
		);
		return {
			form: 'sharing',
			done: `Approved: ${requester.name} now has access and has been told.`
		};
	},
	decline: async (event: Event) => {
		const { db, found, form } = await setUp(event);
		const parsed = parseForm(declineRequestSchema, form);
		if (!parsed.ok) return fail(400, { ...parsed, form: 'sharing' });
		const { request, requester } = await answerRequest(
			db,
			event.locals.viewer,
			found,
			parsed.data.requestId,
			{ approve: false, reason: parsed.data.reason }
		);
		await mailSharing(
			[requester],
			mailTemplates.accessDeclined(
				found.dataset,
				parsed.data.reason,
				datasetUrl(found.dataset.id, true)
			),
			`decline of request ${request.id}`
		);
		return { form: 'sharing', done: `Declined; ${requester.name} has been told why.` };
	},
	grant: async (event: Event) => {
		const { db, found, form } = await setUp(event);
		const parsed = parseForm(grantSchema, form);
		if (!parsed.ok) return fail(400, { ...parsed, form: 'sharing' });
		const { email, organisationId, expiresOn } = parsed.data;
		const result = await grantAccess(
			db,
			event.locals.viewer,
			found,
			email ? { email } : { organisationId },
			expiresOn
		);
		if (!result.ok)
			return fail(400, { form: 'sharing', message: result.message, values: { email } });
		await mailSharing(
			result.notify,
			mailTemplates.accessGranted(found.dataset, expiresOn, datasetUrl(found.dataset.id)),
			`grant on dataset ${found.dataset.id}`
		);
		return { form: 'sharing', done: `Access granted to ${result.grantee}.` };
	},
	revoke: async (event: Event) => {
		const { db, found, form } = await setUp(event);
		const parsed = parseForm(revokeSchema, form);
		if (!parsed.ok) return fail(400, { ...parsed, form: 'sharing' });
		const { notify } = await revokeGrant(db, event.locals.viewer, found, parsed.data.grantId);
		await mailSharing(
			notify,
			mailTemplates.accessRevoked(found.dataset, datasetUrl(found.dataset.id, true)),
			`revoke on dataset ${found.dataset.id}`
		);
		return { form: 'sharing', done: 'Access revoked.' };
	}
};

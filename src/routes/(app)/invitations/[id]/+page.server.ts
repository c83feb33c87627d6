import { error, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { findInvitation } from '$lib/server/repositories/members';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const invitation = await findInvitation(getDb(), event.params.id);
	if (!invitation) error(404, 'No such invitation.');
	// Only the invited address learns what the invitation is (organisation, role, state);
	// anyone else holding the link learns only that it is not theirs.
	if (invitation.email.toLowerCase() !== user.email.toLowerCase()) {
		return { invitation: { forMe: false as const } };
	}
	return {
		invitation: {
			forMe: true as const,
			organisationName: invitation.organisationName,
			organisationSlug: invitation.organisationSlug,
			role: invitation.role,
			status: invitation.status,
			expired: invitation.expiresAt < new Date()
		}
	};
};

export const actions: Actions = {
	accept: async (event) => {
		requireUser(event, 'action');
		const invitation = await findInvitation(getDb(), event.params.id);
		if (!invitation) error(404, 'No such invitation.');
		try {
			await auth().api.acceptInvitation({
				body: { invitationId: event.params.id },
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		redirect(303, `/organisations/${invitation.organisationSlug}`);
	},
	decline: async (event) => {
		requireUser(event, 'action');
		try {
			await auth().api.rejectInvitation({
				body: { invitationId: event.params.id },
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		return { declined: true };
	}
};

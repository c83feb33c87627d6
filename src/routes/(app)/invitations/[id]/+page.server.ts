import { error, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { invitationForViewer } from '$lib/server/repositories/members';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	// Signed out, the link still explains itself and offers both ways in, each coming back here;
	// what the invitation is for is shown only to the invited address once signed in.
	if (!event.locals.user) return { invitation: null, here: event.url.pathname };
	const invitation = await invitationForViewer(getDb(), event.locals.viewer, event.params.id);
	if (!invitation) error(404, 'No such invitation.');
	return { invitation, here: event.url.pathname };
};

export const actions: Actions = {
	accept: async (event) => {
		requireUser(event, 'action');
		const invitation = await invitationForViewer(getDb(), event.locals.viewer, event.params.id);
		if (!invitation) error(404, 'No such invitation.');
		try {
			await auth().api.acceptInvitation({
				body: { invitationId: event.params.id },
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		// better-auth refused above unless the invitation is this user's, so it is theirs here.
		redirect(303, invitation.forMe ? `/organisations/${invitation.organisationSlug}` : '/account');
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

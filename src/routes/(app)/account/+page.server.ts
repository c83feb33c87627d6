import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { listMyOrganisations } from '$lib/server/repositories/organisations';
import { createApiKey, listApiKeys, revokeApiKey } from '$lib/server/repositories/api-keys';
import { newApiKeySchema, scopesFor } from '$lib/schemas/api-key';
import { isUuid } from '$lib/uuid';
import { parseForm } from '$lib/schemas/form';
import { changePasswordSchema, emailOnlySchema, profileSchema } from '$lib/schemas/account';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const sessions = await auth().api.listSessions({ headers: event.request.headers });
	const memberships = await listMyOrganisations(getDb(), event.locals.viewer);
	const apiKeys = await listApiKeys(getDb(), user.id);
	const currentId = event.locals.session?.id;
	return {
		passwordChanged: event.url.searchParams.get('password') === 'changed',
		profile: { name: user.name, email: user.email, emailVerified: user.emailVerified },
		activeOrganisationId: event.locals.session?.activeOrganizationId ?? null,
		memberships,
		// The hash never leaves the server; the page shows the prefix only.
		apiKeys: apiKeys.map((k) => ({
			...k,
			expiresAt: k.expiresAt?.toISOString() ?? null,
			lastUsedAt: k.lastUsedAt?.toISOString() ?? null,
			revokedAt: k.revokedAt?.toISOString() ?? null,
			createdAt: k.createdAt.toISOString()
		})),
		// Never send session tokens to the page; actions look them up by id.
		sessions: sessions.map((s) => ({
			id: s.id,
			current: s.id === currentId,
			userAgent: s.userAgent ?? 'unknown browser',
			ipAddress: s.ipAddress ?? '',
			createdAt: s.createdAt.toISOString(),
			expiresAt: s.expiresAt.toISOString()
		}))
	};
};

export const actions: Actions = {
	profile: async (event) => {
		requireUser(event, 'action');
		const parsed = parseForm(profileSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'profile' });
		await auth().api.updateUser({
			body: { name: parsed.data.name },
			headers: event.request.headers
		});
		return { form: 'profile', saved: true };
	},
	email: async (event) => {
		requireUser(event, 'action');
		const parsed = parseForm(emailOnlySchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'email' });
		try {
			// The confirmation goes to the current address; once confirmed, the new address gets its
			// own verification link, and only then does the account switch (see create-auth.ts).
			await auth().api.changeEmail({
				body: { newEmail: parsed.data.email, callbackURL: '/account' },
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err, { form: 'email' });
		}
		return { form: 'email', sent: parsed.data.email };
	},
	password: async (event) => {
		requireUser(event, 'action');
		const parsed = parseForm(changePasswordSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'password' });
		try {
			await auth().api.changePassword({
				body: {
					currentPassword: parsed.data.currentPassword,
					newPassword: parsed.data.password,
					revokeOtherSessions: true
				},
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err, { form: 'password' });
		}
		// The change replaces this browser's session too; load the page again with the new cookie.
		redirect(303, '/account?password=changed');
	},
	revoke: async (event) => {
		requireUser(event, 'action');
		const id = z
			.string()
			.min(1)
			.safeParse((await event.request.formData()).get('sessionId'));
		if (!id.success) return fail(400, { form: 'sessions', message: 'No session chosen.' });
		const sessions = await auth().api.listSessions({ headers: event.request.headers });
		const target = sessions.find((s) => s.id === id.data);
		if (!target) return fail(404, { form: 'sessions', message: 'That session has ended already.' });
		await auth().api.revokeSession({
			body: { token: target.token },
			headers: event.request.headers
		});
		return { form: 'sessions', revoked: true };
	},
	createKey: async (event) => {
		requireUser(event, 'action');
		const parsed = parseForm(newApiKeySchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'apiKeys' });
		const { keyName: name, access, lifetimeDays } = parsed.data;
		const expiresAt = lifetimeDays ? new Date(Date.now() + lifetimeDays * 86_400_000) : null;
		const created = await createApiKey(getDb(), event.locals.viewer, {
			name,
			scopes: scopesFor(access),
			expiresAt
		});
		// Shown once: only this answer carries the key; the database keeps its hash.
		return { form: 'apiKeys', createdKey: created.key, createdName: name };
	},
	revokeKey: async (event) => {
		requireUser(event, 'action');
		const id = String((await event.request.formData()).get('keyId') ?? '');
		if (!isUuid(id) || !(await revokeApiKey(getDb(), event.locals.viewer, id)))
			return fail(404, {
				form: 'apiKeys',
				message: 'That key does not exist or is revoked already.'
			});
		return { form: 'apiKeys', revokedKey: true };
	},
	revokeOthers: async (event) => {
		requireUser(event, 'action');
		await auth().api.revokeOtherSessions({ headers: event.request.headers });
		return { form: 'sessions', revoked: true };
	},
	activate: async (event) => {
		const user = requireUser(event, 'action');
		const organisationId = String((await event.request.formData()).get('organisationId') ?? '');
		if (!(organisationId in event.locals.viewer.roles)) {
			return fail(403, {
				form: 'organisations',
				message: 'You are not a member of that organisation.'
			});
		}
		await auth().api.setActiveOrganization({
			body: { organizationId: organisationId },
			headers: event.request.headers
		});
		return { form: 'organisations', activated: organisationId, userId: user.id };
	}
};

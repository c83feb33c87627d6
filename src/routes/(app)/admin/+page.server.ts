import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { requirePlatformAdmin } from '$lib/server/guards';
import { recordSuspension } from '$lib/server/repositories/members';
import { listOrganisationsForAdmin } from '$lib/server/repositories/organisations';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requirePlatformAdmin(event);
	const q = event.url.searchParams.get('q')?.trim() ?? '';
	const users = await auth().api.listUsers({
		query: {
			limit: 100,
			sortBy: 'email',
			...(q
				? { searchValue: q, searchField: 'email' as const, searchOperator: 'contains' as const }
				: {})
		},
		headers: event.request.headers
	});
	const organisations = await listOrganisationsForAdmin(getDb(), event.locals.viewer);
	return {
		q,
		users: users.users.map((u) => ({
			id: u.id,
			name: u.name,
			email: u.email,
			role: u.role ?? 'user',
			banned: Boolean(u.banned),
			emailVerified: u.emailVerified
		})),
		total: users.total,
		organisations
	};
};

const userIdSchema = z.object({
	userId: z.string().min(1),
	reason: z.string().max(300).optional()
});

export const actions: Actions = {
	suspend: async (event) => {
		const admin = requirePlatformAdmin(event, 'action');
		const parsed = userIdSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { message: 'No user chosen.' });
		if (parsed.data.userId === admin.id)
			return fail(400, { message: 'You cannot suspend yourself.' });
		try {
			await auth().api.banUser({
				body: {
					userId: parsed.data.userId,
					banReason: parsed.data.reason || 'Suspended by a platform administrator'
				},
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		await recordSuspension(
			getDb(),
			event.locals.viewer,
			parsed.data.userId,
			'suspend',
			parsed.data.reason || null
		);
		return { done: 'suspended' };
	},
	restore: async (event) => {
		requirePlatformAdmin(event, 'action');
		const parsed = userIdSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { message: 'No user chosen.' });
		try {
			await auth().api.unbanUser({
				body: { userId: parsed.data.userId },
				headers: event.request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		await recordSuspension(getDb(), event.locals.viewer, parsed.data.userId, 'restore', null);
		return { done: 'restored' };
	}
};

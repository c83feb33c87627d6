import { error, fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { organisationAndMembership, requireOrgPermission, requireUser } from '$lib/server/guards';
import { roleCan } from '$lib/server/permissions';
import {
	listMembers,
	listPendingInvitations,
	recordRoleChange
} from '$lib/server/repositories/members';
import { parseForm } from '$lib/schemas/form';
import {
	changeRoleSchema,
	inviteSchema,
	memberIdSchema,
	organisationSchema
} from '$lib/schemas/organisation';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const { org, membership } = await organisationAndMembership(event, event.params.slug);
	if (!membership)
		error(403, 'Only members of this organisation can see its members and settings.');
	const db = getDb();
	const role = membership.role;
	return {
		organisation: {
			id: org.id,
			name: org.name,
			slug: org.slug,
			country: org.country ?? '',
			website: org.website ?? '',
			description: org.description ?? ''
		},
		me: { userId: user.id, memberId: membership.id, role },
		can: {
			update: roleCan(role, 'organization', 'update'),
			invite: roleCan(role, 'invitation', 'create'),
			cancelInvitation: roleCan(role, 'invitation', 'cancel'),
			changeRoles: roleCan(role, 'member', 'update'),
			removeMembers: roleCan(role, 'member', 'delete')
		},
		members: await listMembers(db, org.id),
		invitations: roleCan(role, 'invitation', 'create')
			? await listPendingInvitations(db, org.id)
			: []
	};
};

/** Run a better-auth organisation call as the signed-in user, turning its errors into form failures. */
async function asUser(event: RequestEvent, call: () => Promise<unknown>, form: string) {
	try {
		await call();
	} catch (err) {
		return authFailure(err, { form });
	}
	return null;
}

export const actions: Actions = {
	update: async (event) => {
		const { org } = await requireOrgPermission(event, event.params.slug!, 'organization', 'update');
		const parsed = parseForm(organisationSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'update' });
		const { slug, ...data } = parsed.data;
		const failed = await asUser(
			event,
			() =>
				auth().api.updateOrganization({
					body: { organizationId: org.id, data: { ...data, slug } },
					headers: event.request.headers
				}),
			'update'
		);
		if (failed) return failed;
		if (slug !== org.slug) redirect(303, `/organisations/${slug}/settings`);
		return { form: 'update', saved: true };
	},
	invite: async (event) => {
		const { org } = await requireOrgPermission(event, event.params.slug!, 'invitation', 'create');
		const parsed = parseForm(inviteSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'invite' });
		const failed = await asUser(
			event,
			() =>
				auth().api.createInvitation({
					body: { organizationId: org.id, email: parsed.data.email, role: parsed.data.role },
					headers: event.request.headers
				}),
			'invite'
		);
		return failed ?? { form: 'invite', invited: parsed.data.email };
	},
	cancelInvitation: async (event) => {
		await requireOrgPermission(event, event.params.slug!, 'invitation', 'cancel');
		const invitationId = String((await event.request.formData()).get('invitationId') ?? '');
		const failed = await asUser(
			event,
			() => auth().api.cancelInvitation({ body: { invitationId }, headers: event.request.headers }),
			'invitations'
		);
		return failed ?? { form: 'invitations', cancelled: true };
	},
	changeRole: async (event) => {
		const { org } = await requireOrgPermission(event, event.params.slug!, 'member', 'update');
		const parsed = parseForm(changeRoleSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'members' });
		const failed = await asUser(
			event,
			() =>
				auth().api.updateMemberRole({
					body: { organizationId: org.id, memberId: parsed.data.memberId, role: parsed.data.role },
					headers: event.request.headers
				}),
			'members'
		);
		if (failed) return failed;
		await recordRoleChange(
			getDb(),
			event.locals.viewer,
			org.id,
			parsed.data.memberId,
			parsed.data.role
		);
		return { form: 'members', saved: true };
	},
	transfer: async (event) => {
		const { org, membership } = await requireOrgPermission(
			event,
			event.params.slug!,
			'member',
			'update'
		);
		const parsed = parseForm(memberIdSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'members' });
		if (parsed.data.memberId === membership.id) {
			return fail(400, { form: 'members', message: 'Choose another member to hand ownership to.' });
		}
		// Promote first, then step down: the organisation is never without an owner in between.
		const failed =
			(await asUser(
				event,
				() =>
					auth().api.updateMemberRole({
						body: { organizationId: org.id, memberId: parsed.data.memberId, role: 'owner' },
						headers: event.request.headers
					}),
				'members'
			)) ??
			(await asUser(
				event,
				() =>
					auth().api.updateMemberRole({
						body: { organizationId: org.id, memberId: membership.id, role: 'curator' },
						headers: event.request.headers
					}),
				'members'
			));
		if (failed) return failed;
		const db = getDb();
		await recordRoleChange(db, event.locals.viewer, org.id, parsed.data.memberId, 'owner');
		await recordRoleChange(db, event.locals.viewer, org.id, membership.id, 'curator');
		return { form: 'members', transferred: true };
	},
	remove: async (event) => {
		const { org } = await requireOrgPermission(event, event.params.slug!, 'member', 'delete');
		const parsed = parseForm(memberIdSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'members' });
		const failed = await asUser(
			event,
			() =>
				auth().api.removeMember({
					body: { organizationId: org.id, memberIdOrEmail: parsed.data.memberId },
					headers: event.request.headers
				}),
			'members'
		);
		return failed ?? { form: 'members', removed: true };
	},
	leave: async (event) => {
		requireUser(event, 'action');
		const { org, membership } = await organisationAndMembership(event, event.params.slug!);
		if (!membership) error(403, 'You are not a member of this organisation.');
		const failed = await asUser(
			event,
			() =>
				auth().api.leaveOrganization({
					body: { organizationId: org.id },
					headers: event.request.headers
				}),
			'leave'
		);
		if (failed) return failed;
		redirect(303, '/account');
	}
};

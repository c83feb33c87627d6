import { and, asc, eq, gt } from 'drizzle-orm';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { invitation, member, organisation, user } from '../db/schema';
import { recordAudit } from './audit';

/** Members of an organisation with their names, e-mail addresses and roles. */
export async function listMembers(db: Db, organisationId: string) {
	return db
		.select({
			memberId: member.id,
			userId: user.id,
			name: user.name,
			email: user.email,
			role: member.role,
			since: member.createdAt
		})
		.from(member)
		.innerJoin(user, eq(member.userId, user.id))
		.where(eq(member.organizationId, organisationId))
		.orderBy(asc(user.name));
}

/** Invitations of an organisation still waiting for an answer and not expired. */
export async function listPendingInvitations(db: Db, organisationId: string) {
	return db
		.select({
			id: invitation.id,
			email: invitation.email,
			role: invitation.role,
			expiresAt: invitation.expiresAt
		})
		.from(invitation)
		.where(
			and(
				eq(invitation.organizationId, organisationId),
				eq(invitation.status, 'pending'),
				gt(invitation.expiresAt, new Date())
			)
		)
		.orderBy(asc(invitation.email));
}

/** One invitation with its organisation's and inviter's names, for the invitation page. */
export async function findInvitation(db: Db, id: string) {
	const [row] = await db
		.select({
			id: invitation.id,
			email: invitation.email,
			role: invitation.role,
			status: invitation.status,
			expiresAt: invitation.expiresAt,
			organisationName: organisation.name,
			organisationSlug: organisation.slug,
			inviterName: user.name
		})
		.from(invitation)
		.innerJoin(organisation, eq(invitation.organizationId, organisation.id))
		.leftJoin(user, eq(invitation.inviterId, user.id))
		.where(eq(invitation.id, id));
	return row ?? null;
}

/**
 * An invitation as the viewer may see it: null when unknown; only the invited address learns what
 * it is (organisation, role, state); anyone else holding the link learns only that it is not
 * theirs.
 */
export async function invitationForViewer(db: Db, viewer: Viewer, id: string) {
	const found = await findInvitation(db, id);
	if (!found || !viewer.userId) return null;
	const [me] = await db.select({ email: user.email }).from(user).where(eq(user.id, viewer.userId));
	if (!me || found.email.toLowerCase() !== me.email.toLowerCase()) {
		return { forMe: false as const };
	}
	return {
		forMe: true as const,
		organisationName: found.organisationName,
		organisationSlug: found.organisationSlug,
		inviterName: found.inviterName,
		role: found.role,
		status: found.status,
		expired: found.expiresAt < new Date()
	};
}

/** Record a role given to a member (the change itself went through better-auth). */
export async function recordRoleChange(
	db: Db,
	viewer: Viewer,
	organisationId: string,
	memberId: string,
	role: string
) {
	const [target] = await db
		.select({ userId: user.id, name: user.name, email: user.email })
		.from(member)
		.innerJoin(user, eq(member.userId, user.id))
		.where(and(eq(member.id, memberId), eq(member.organizationId, organisationId)));
	await recordAudit(db, viewer, {
		action: 'role-change',
		organisationId,
		datasetId: null,
		details: { memberId, role, userId: target?.userId, name: target?.name, email: target?.email }
	});
}

/** Record a platform administrator suspending or restoring an account (done through better-auth). */
export async function recordSuspension(
	db: Db,
	viewer: Viewer,
	userId: string,
	action: 'suspend' | 'restore',
	reason: string | null
) {
	const [target] = await db
		.select({ name: user.name, email: user.email })
		.from(user)
		.where(eq(user.id, userId));
	await recordAudit(db, viewer, {
		action,
		organisationId: null,
		datasetId: null,
		details: { userId, name: target?.name, email: target?.email, ...(reason ? { reason } : {}) }
	});
}

import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { getDb } from './db';
import { member, organisation } from './db/schema';
import { roleCan, type Action, type Resource } from './permissions';

/** The signed-in user, or a redirect to sign-in (pages) / 401 (actions and API). */
export function requireUser(event: RequestEvent, mode: 'page' | 'action' = 'page') {
	const user = event.locals.user;
	if (user) return user;
	if (mode === 'page') {
		redirect(303, `/sign-in?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
	}
	error(401, 'Sign in first.');
}

export function requirePlatformAdmin(event: RequestEvent, mode: 'page' | 'action' = 'page') {
	const user = requireUser(event, mode);
	if (!event.locals.viewer.isPlatformAdmin) error(403, 'Only platform administrators may do this.');
	return user;
}

/** The organisation for a slug and the user's membership in it (null when not a member); 404 if unknown. */
export async function organisationAndMembership(slug: string, userId: string | null) {
	const db = getDb();
	const [org] = await db.select().from(organisation).where(eq(organisation.slug, slug));
	if (!org) error(404, 'No such organisation.');
	if (!userId) return { org, membership: null };
	const [membership] = await db
		.select()
		.from(member)
		.where(and(eq(member.organizationId, org.id), eq(member.userId, userId)));
	return { org, membership: membership ?? null };
}

/**
 * Require a permission from permissions.ts in the organisation with this slug. Anonymous: 401
 * (or sign-in redirect); not a member or role lacks it: 403; unknown organisation: 404.
 */
export async function requireOrgPermission<R extends Resource>(
	event: RequestEvent,
	slug: string,
	resource: R,
	action: Action<R>,
	mode: 'page' | 'action' = 'action'
) {
	const user = requireUser(event, mode);
	const { org, membership } = await organisationAndMembership(slug, user.id);
	if (!membership || !roleCan(membership.role, resource, action)) {
		error(403, 'Your role in this organisation does not allow this.');
	}
	return { user, org, membership };
}

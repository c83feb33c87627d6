import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { getDb } from './db';
import type { z } from 'zod';
import { roleCan, type Action, type Resource } from './permissions';
import { organisationBySlug } from './repositories/organisations';

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
export async function organisationAndMembership(event: RequestEvent, slug: string) {
	return organisationBySlug(getDb(), event.locals.viewer, slug);
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
	const { org, membership } = await organisationAndMembership(event, slug);
	if (!membership || !roleCan(membership.role, resource, action)) {
		error(403, 'Your role in this organisation does not allow this.');
	}
	return { user, org, membership };
}

/** THE upload check for sites, logs and files: 403 with the reason unless the viewer may upload. */
export function requireUpload(found: { can: { upload: boolean }; uploadRefusal: string | null }) {
	if (!found.can.upload) error(403, found.uploadRefusal ?? 'You may not upload here.');
}

/** The request's JSON body parsed with a shared zod schema; 400 naming each problem otherwise. */
export async function parseBody<S extends z.ZodType>(
	event: RequestEvent,
	schema: S
): Promise<z.output<S>> {
	const parsed = schema.safeParse(await event.request.json().catch(() => null));
	if (!parsed.success)
		error(
			400,
			`The request could not be read: ${parsed.error.issues.map((i) => `${i.path.join('.') || 'body'}: ${i.message}`).join('; ')}`
		);
	return parsed.data;
}

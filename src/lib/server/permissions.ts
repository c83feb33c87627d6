import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements as orgDefaults } from 'better-auth/plugins/organization/access';
// Relative, not $lib: scripts (seed, CLI) import this file outside SvelteKit.
import { isOrgRole, type OrgRole } from '../roles';

export { ORG_ROLES, ROLE_LABELS, isOrgRole, type OrgRole } from '../roles';

/**
 * THE statement of who may do what in an organisation. better-auth's organization plugin enforces
 * the membership statements on its own endpoints; Thermalith's routes call `roleCan` for the rest.
 * Change a rule here and nowhere else.
 */
export const statements = {
	...orgDefaults,
	/** read-private: see the organisation's unpublished, embargoed and restricted data. */
	dataset: [
		'read-private',
		'create',
		'edit-draft',
		'submit',
		'review',
		'publish',
		'retire',
		'delete'
	],
	/** Decide who outside the organisation may see restricted or embargoed data. */
	access: ['grant', 'revoke', 'answer-request', 'see-downloads'],
	upload: ['create'],
	/** Read (and export) the organisation's audit log. */
	audit: ['read']
} as const;

export const ac = createAccessControl(statements);

const everyDatasetAction = [...statements.dataset];

export const roles = {
	owner: ac.newRole({
		organization: ['update', 'delete'],
		member: ['create', 'update', 'delete'],
		invitation: ['create', 'cancel'],
		dataset: everyDatasetAction,
		access: ['grant', 'revoke', 'answer-request', 'see-downloads'],
		upload: ['create'],
		audit: ['read']
	}),
	curator: ac.newRole({
		dataset: everyDatasetAction,
		access: ['grant', 'revoke', 'answer-request', 'see-downloads'],
		upload: ['create'],
		audit: ['read']
	}),
	contributor: ac.newRole({
		dataset: ['read-private', 'create', 'edit-draft', 'submit'],
		upload: ['create']
	}),
	viewer: ac.newRole({
		dataset: ['read-private']
	})
} satisfies Record<OrgRole, unknown>;

type Statements = typeof statements;
export type Resource = keyof Statements;
export type Action<R extends Resource> = Statements[R][number];

/** Whether an organisation role allows an action. Unknown roles allow nothing. */
export function roleCan<R extends Resource>(
	role: string | null | undefined,
	resource: R,
	action: Action<R>
): boolean {
	if (!role || !isOrgRole(role)) return false;
	const result = roles[role].authorize({ [resource]: [action] } as never);
	return result.success;
}

/** Platform roles (better-auth admin plugin): 'admin' runs the platform, 'user' is everyone else. */
export const PLATFORM_ADMIN_ROLE = 'admin';

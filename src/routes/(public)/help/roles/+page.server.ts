import {
	ORG_ROLES,
	roleCan,
	ROLE_LABELS,
	type Action,
	type Resource
} from '$lib/server/permissions';
import { ROLE_DESCRIPTIONS } from '$lib/roles';
import type { PageServerLoad } from './$types';

/** The tasks people ask about, each tied to its statement in permissions.ts (the one rule). */
const TASKS: { label: string; resource: Resource; action: string }[] = [
	{
		label: 'See the organisation’s unpublished, embargoed and restricted data',
		resource: 'dataset',
		action: 'read-private'
	},
	{
		label: 'Create datasets and import sites, logs and files',
		resource: 'upload',
		action: 'create'
	},
	{ label: 'Edit drafts', resource: 'dataset', action: 'edit-draft' },
	{ label: 'Submit a draft for review', resource: 'dataset', action: 'submit' },
	{
		label: 'Return a dataset with comments, or publish it',
		resource: 'dataset',
		action: 'publish'
	},
	{ label: 'Retire a published dataset', resource: 'dataset', action: 'retire' },
	{ label: 'Delete a draft that was never published', resource: 'dataset', action: 'delete' },
	{ label: 'Grant, revoke and answer requests for access', resource: 'access', action: 'grant' },
	{ label: 'Invite members', resource: 'invitation', action: 'create' },
	{ label: 'Change members’ roles and remove members', resource: 'member', action: 'update' },
	{ label: 'Change or delete the organisation', resource: 'organization', action: 'update' }
];

export const load: PageServerLoad = () => ({
	roles: ORG_ROLES.map((role) => ({
		role,
		label: ROLE_LABELS[role],
		description: ROLE_DESCRIPTIONS[role]
	})),
	tasks: TASKS.map((t) => ({
		label: t.label,
		allowed: ORG_ROLES.map((role) =>
			roleCan(role, t.resource, t.action as Action<typeof t.resource>)
		)
	}))
});

/**
 * Organisation role names and their descriptions, shared by pages and server. What each role may
 * do is stated once, in src/lib/server/permissions.ts.
 */
export const ORG_ROLES = ['owner', 'curator', 'contributor', 'viewer'] as const;
export type OrgRole = (typeof ORG_ROLES)[number];

export const ROLE_LABELS: Record<OrgRole, string> = {
	owner: 'Owner',
	curator: 'Curator',
	contributor: 'Contributor',
	viewer: 'Viewer'
};

export const ROLE_DESCRIPTIONS: Record<OrgRole, string> = {
	owner: 'Manages members, roles and the organisation itself, and everything a curator does.',
	curator:
		"Reviews, publishes and retires the organisation's datasets and decides who may see them.",
	contributor: 'Uploads data and edits drafts, and submits them for review.',
	viewer: "Sees the organisation's private, embargoed and restricted data."
};

export function isOrgRole(value: string): value is OrgRole {
	return (ORG_ROLES as readonly string[]).includes(value);
}

/**
 * Who is asking. Built once per request in hooks.server.ts (see ../session-viewer.ts); anonymous visitors
 * have no user id and no memberships.
 */
export interface Viewer {
	userId: string | null;
	/** Confirmed e-mail address: required to upload (see rights.ts). */
	emailVerified: boolean;
	/** The viewer's role in each organisation they belong to, by organisation id. */
	roles: Record<string, string>;
	/** Runs the platform (accounts, organisations); sees no unpublished data (README.md here). */
	isPlatformAdmin: boolean;
}

export const ANONYMOUS: Viewer = {
	userId: null,
	emailVerified: false,
	roles: {},
	isPlatformAdmin: false
};

import { and, eq, inArray, lte, or, sql, type SQL } from 'drizzle-orm';
import { dataset } from './db/schema';

/**
 * Who is asking. Built once per request in hooks.server.ts; anonymous visitors have no user id
 * and no memberships.
 */
export interface Viewer {
	userId: string | null;
	/** Confirmed e-mail address: required to upload (see canUpload in dataset-access.ts). */
	emailVerified: boolean;
	/** The viewer's role in each organisation they belong to, by organisation id. */
	roles: Record<string, string>;
	isPlatformAdmin: boolean;
}

export const ANONYMOUS: Viewer = {
	userId: null,
	emailVerified: false,
	roles: {},
	isPlatformAdmin: false
};

/** Organisations the viewer is a member of (any role), whose own datasets they may see. */
export function memberOrganisations(viewer: Viewer): string[] {
	return Object.keys(viewer.roles);
}

/**
 * THE rule for which datasets (and so which sites, grids, statistics, exports and files) a viewer
 * may see. Every query that returns sites goes through this condition; do not write another.
 * Anyone: published datasets that are public, or embargoed with the release date passed.
 * Members: every dataset of their own organisations, whatever its state.
 * Platform administrators: everything.
 */
export function visibleDatasets(viewer: Viewer): SQL {
	if (viewer.isPlatformAdmin) return sql`true`;
	const released = and(
		eq(dataset.status, 'published'),
		or(
			eq(dataset.visibility, 'public'),
			and(eq(dataset.visibility, 'embargoed'), lte(dataset.embargoUntil, sql`current_date`))
		)
	)!;
	const own = memberOrganisations(viewer);
	if (own.length === 0) return released;
	return or(released, inArray(dataset.organisationId, own))!;
}

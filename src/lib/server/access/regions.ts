import { eq, inArray, or, sql, type SQL } from 'drizzle-orm';
import { savedRegion } from '../db/schema';
import type { Viewer } from './viewer';

/**
 * THE rule for saved regions (repositories/saved-regions.ts): a viewer sees the regions they made
 * and those shared with an organisation they belong to (any role); nobody else's, platform
 * administrators included. Anonymous viewers have none.
 */
export function visibleRegions(viewer: Viewer): SQL {
	if (!viewer.userId) return sql`false`;
	const orgs = Object.keys(viewer.roles);
	const own = eq(savedRegion.ownerId, viewer.userId);
	return orgs.length ? or(own, inArray(savedRegion.organisationId, orgs))! : own;
}

/** Regions the viewer may rename, re-share or delete: their own only. */
export function ownRegions(viewer: Viewer): SQL {
	if (!viewer.userId) return sql`false`;
	return eq(savedRegion.ownerId, viewer.userId);
}

/** A region may be shared only with an organisation its owner belongs to. */
export function mayShareWith(viewer: Viewer, organisationId: string): boolean {
	return Object.hasOwn(viewer.roles, organisationId);
}

import { and, eq, inArray, isNull, lte, ne, or, sql, type SQL } from 'drizzle-orm';
import { dataset } from '../db/schema';
import { roleCan, type Action, type Resource } from '../permissions';
import type { Viewer } from './viewer';

/** Organisations in which the viewer's role allows an action of permissions.ts. */
export function organisationsWhere<R extends Resource>(
	viewer: Viewer,
	resource: R,
	action: Action<R>
): string[] {
	return Object.entries(viewer.roles)
		.filter(([, role]) => roleCan(role, resource, action))
		.map(([id]) => id);
}

/**
 * What anyone may see: datasets that were published (published or retired, which stays citable)
 * and are public, or embargoed with the release date passed. Restricted and private datasets are
 * not released to the public.
 */
function released(): SQL {
	return and(
		inArray(dataset.status, ['published', 'retired']),
		or(
			eq(dataset.visibility, 'public'),
			and(eq(dataset.visibility, 'embargoed'), lte(dataset.embargoUntil, sql`current_date`))
		)
	)!;
}

/**
 * THE rule for which datasets, and so which sites, logs, samples, computations, files, counts and
 * exports a viewer may see. Every query that returns any of them joins `dataset` and adds this
 * condition; do not write another.
 * - Anyone: released datasets (above).
 * - Members whose role has `dataset:read-private` (every organisation role): all datasets of their
 *   organisation, whatever the status or visibility.
 * - Platform administrators: nothing more than their memberships give (README.md
 *   here).
 */
export function visibleDatasets(viewer: Viewer): SQL {
	const own = organisationsWhere(viewer, 'dataset', 'read-private');
	if (own.length === 0) return released();
	return or(released(), inArray(dataset.organisationId, own))!;
}

/**
 * Maps and map queries: visible datasets, without retired and superseded ones (still readable on
 * their page), so a corrected site shows once, as its latest version.
 */
export function visibleOnMaps(viewer: Viewer): SQL {
	return and(
		visibleDatasets(viewer),
		ne(dataset.status, 'retired'),
		isNull(dataset.supersededById)
	)!;
}

/**
 * Import history and import progress: the organisation's own business (file names, errors, who),
 * so only members with `dataset:read-private`, never the public, even on published datasets.
 */
export function visibleImports(viewer: Viewer): SQL {
	const own = organisationsWhere(viewer, 'dataset', 'read-private');
	return own.length ? inArray(dataset.organisationId, own) : sql`false`;
}

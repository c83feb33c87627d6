import { and, eq, inArray, isNull, lte, ne, or, sql, type SQL } from 'drizzle-orm';
import { utcDay } from '../clock';
import { accessGrant, dataset } from '../db/schema';
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

/** States in which a dataset is out (published, or retired and still citable). */
const OUT = ['published', 'retired'] as const;

/**
 * An embargo whose release date (UTC) is `at`'s day or earlier. THE condition shared by the rule
 * below and the release job (jobs/embargo-release.ts), so both agree on the day.
 */
export function embargoPassed(at: Date): SQL {
	return and(eq(dataset.visibility, 'embargoed'), lte(dataset.embargoUntil, utcDay(at)))!;
}

/**
 * What anyone may see: datasets that were published (published or retired, which stays citable)
 * and are public, or embargoed with the release date passed. Restricted and private datasets are
 * not released to the public.
 */
function released(at: Date): SQL {
	return and(
		inArray(dataset.status, OUT),
		or(eq(dataset.visibility, 'public'), embargoPassed(at))
	)!;
}

/**
 * A grant in force for this viewer on a published restricted or embargoed dataset: to them or to
 * an organisation they belong to, not revoked, and not expired (expiresOn is the last day, UTC),
 * so an expired grant stops working without anyone acting. Private datasets ignore grants.
 */
export function grantInForce(viewer: Viewer, at: Date = new Date()): SQL {
	if (!viewer.userId) return sql`false`;
	const orgs = organisationsWhere(viewer, 'dataset', 'read-private');
	const grantee = orgs.length
		? or(eq(accessGrant.userId, viewer.userId), inArray(accessGrant.organisationId, orgs))!
		: eq(accessGrant.userId, viewer.userId);
	return and(
		inArray(dataset.status, OUT),
		inArray(dataset.visibility, ['embargoed', 'restricted']),
		sql`exists (select 1 from ${accessGrant} where ${accessGrant.datasetId} = ${dataset.id}
			and ${accessGrant.revokedAt} is null
			and (${accessGrant.expiresOn} is null or ${accessGrant.expiresOn} >= ${utcDay(at)})
			and ${grantee})`
	)!;
}

/**
 * THE rule for which datasets, and so which sites, logs, samples, computations, files, counts and
 * exports a viewer may see. Every query that returns any of them joins `dataset` and adds this
 * condition; do not write another.
 * - Anyone: released datasets (above).
 * - Grantees: restricted and embargoed datasets they hold a grant in force for (above).
 * - Members whose role has `dataset:read-private` (every organisation role): all datasets of their
 *   organisation, whatever the status or visibility.
 * - Platform administrators: nothing more than their memberships give (README.md
 *   here).
 * `at` is the moment asked about (default now): embargo release and grant expiry depend on it.
 */
export function visibleDatasets(viewer: Viewer, at: Date = new Date()): SQL {
	const own = organisationsWhere(viewer, 'dataset', 'read-private');
	const shared = or(released(at), grantInForce(viewer, at))!;
	if (own.length === 0) return shared;
	return or(shared, inArray(dataset.organisationId, own))!;
}

/**
 * The catalogue entry of a dataset the viewer may not see whole: published (or retired)
 * restricted and embargoed datasets show their title, abstract, licence and organisation to
 * anyone, so people can cite them and ask for access; embargoed ones also their site count and
 * locations rounded to 0.1° cells (repositories/access.ts). Never values, names, codes or files.
 */
export function catalogueEntries(): SQL {
	return and(
		inArray(dataset.status, OUT),
		inArray(dataset.visibility, ['embargoed', 'restricted'])
	)!;
}

/**
 * Maps and map queries: visible datasets, without retired and superseded ones (still readable on
 * their page), so a corrected site shows once, as its latest version.
 */
export function visibleOnMaps(viewer: Viewer, at: Date = new Date()): SQL {
	return and(
		visibleDatasets(viewer, at),
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

import { error } from '@sveltejs/kit';
import { and, asc, count, eq } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, member, organisation } from '../db/schema';

/** The public directory of organisations (names and descriptions are public by design). */
export async function listOrganisations(db: Db, viewer: Viewer) {
	// Each card says how many datasets the viewer can open there, counted by the one rule.
	const visible = db
		.select({ organisationId: dataset.organisationId, datasets: count().as('datasets') })
		.from(dataset)
		.where(visibleDatasets(viewer))
		.groupBy(dataset.organisationId)
		.as('visible');
	const rows = await db
		.select({
			id: organisation.id,
			name: organisation.name,
			slug: organisation.slug,
			country: organisation.country,
			website: organisation.website,
			description: organisation.description,
			datasets: visible.datasets
		})
		.from(organisation)
		.leftJoin(visible, eq(visible.organisationId, organisation.id))
		.orderBy(asc(organisation.name));
	return rows.map((r) => ({ ...r, datasets: Number(r.datasets ?? 0) }));
}

/** The organisation for a slug and the viewer's membership in it (null when not a member); 404 if unknown. */
export async function organisationBySlug(db: Db, viewer: Viewer, slug: string) {
	const [org] = await db.select().from(organisation).where(eq(organisation.slug, slug));
	if (!org) error(404, 'No such organisation.');
	if (!viewer.userId) return { org, membership: null };
	const [membership] = await db
		.select()
		.from(member)
		.where(and(eq(member.organizationId, org.id), eq(member.userId, viewer.userId)));
	return { org, membership: membership ?? null };
}

/** The organisations the viewer belongs to, with their role (account page). */
export async function listMyOrganisations(db: Db, viewer: Viewer) {
	if (!viewer.userId) return [];
	return db
		.select({
			id: organisation.id,
			name: organisation.name,
			slug: organisation.slug,
			role: member.role
		})
		.from(member)
		.innerJoin(organisation, eq(member.organizationId, organisation.id))
		.where(eq(member.userId, viewer.userId))
		.orderBy(asc(organisation.name));
}

/** Every organisation with its number of members: platform administrators only. */
export async function listOrganisationsForAdmin(db: Db, viewer: Viewer) {
	if (!viewer.isPlatformAdmin) error(403, 'Only platform administrators may do this.');
	return db
		.select({
			id: organisation.id,
			name: organisation.name,
			slug: organisation.slug,
			members: count(member.id)
		})
		.from(organisation)
		.leftJoin(member, eq(member.organizationId, organisation.id))
		.groupBy(organisation.id)
		.orderBy(asc(organisation.name));
}

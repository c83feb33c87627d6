import { error } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, member, organisation } from '../db/schema';
import { roleCan } from '../permissions';

/**
 * A dataset the viewer may see, with their role in its organisation (null if not a member) and
 * what that role lets them do with it. 404 when it does not exist or is not visible to them, so
 * private datasets cannot be discovered by guessing ids.
 */
export async function datasetForViewer(db: Db, viewer: Viewer, id: string) {
	if (!/^[0-9a-f-]{36}$/i.test(id)) error(404, 'No such dataset.');
	const [row] = await db
		.select({ dataset, organisationName: organisation.name, organisationSlug: organisation.slug })
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(dataset.id, id), visibleDatasets(viewer)));
	if (!row) error(404, 'No such dataset.');
	let role: string | null = null;
	if (viewer.userId) {
		const [m] = await db
			.select({ role: member.role })
			.from(member)
			.where(
				and(eq(member.organizationId, row.dataset.organisationId), eq(member.userId, viewer.userId))
			);
		role = m?.role ?? null;
	}
	const editable = ['draft', 'returned'].includes(row.dataset.status);
	const can = {
		editMetadata:
			roleCan(role, 'dataset', 'publish') || (editable && roleCan(role, 'dataset', 'edit-draft')),
		upload: roleCan(role, 'upload', 'create') && (editable || roleCan(role, 'dataset', 'publish')),
		readPrivate: roleCan(role, 'dataset', 'read-private')
	};
	return { ...row, role, can };
}

import { error } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { visibleDatasets, type Viewer } from '../access';
import type { Db } from '../db/client';
import { dataset, organisation } from '../db/schema';
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
	const role = viewer.roles[row.dataset.organisationId] ?? null;
	const editable = ['draft', 'returned'].includes(row.dataset.status);
	const roleMayUpload =
		roleCan(role, 'upload', 'create') && (editable || roleCan(role, 'dataset', 'publish'));
	const can = {
		editMetadata:
			roleCan(role, 'dataset', 'publish') || (editable && roleCan(role, 'dataset', 'edit-draft')),
		// Uploading (sites, logs, files) also needs a confirmed e-mail address.
		upload: roleMayUpload && viewer.emailVerified,
		readPrivate: roleCan(role, 'dataset', 'read-private')
	};
	const uploadRefusal = can.upload
		? null
		: roleMayUpload
			? 'Confirm your e-mail address before you upload.'
			: 'Your role does not allow adding data to this dataset now.';
	return { ...row, role, can, uploadRefusal };
}

/** THE upload check for sites, logs and files: 403 with the reason unless the viewer may upload. */
export function requireUpload(found: { can: { upload: boolean }; uploadRefusal: string | null }) {
	if (!found.can.upload) error(403, found.uploadRefusal ?? 'You may not upload here.');
}

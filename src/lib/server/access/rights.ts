import { roleCan } from '../permissions';
import type { Viewer } from './viewer';

/** The fields of a dataset its rights depend on. */
export interface DatasetState {
	organisationId: string;
	status: string;
}

/** Draft and returned datasets are the contributor's to change; in review they are the curator's. */
const CONTRIBUTOR_STATES = ['draft', 'returned'];

/**
 * THE statement of what a viewer may do with one dataset they can see, derived from their role in
 * its organisation (permissions.ts) and the dataset's lifecycle state. Published and retired
 * datasets are never changed in place. Platform administrators get no rights here: their role is
 * the platform, not the organisations' data.
 */
export function datasetRights(viewer: Viewer, d: DatasetState) {
	const role = viewer.roles[d.organisationId] ?? null;
	const contributorPhase = CONTRIBUTOR_STATES.includes(d.status);
	const reviewPhase = d.status === 'in_review';
	const mayChange =
		(contributorPhase && roleCan(role, 'dataset', 'edit-draft')) ||
		(reviewPhase && roleCan(role, 'dataset', 'review'));
	const roleMayUpload = mayChange && roleCan(role, 'upload', 'create');
	const can = {
		/** Unpublished data, import history and progress of the organisation. */
		readPrivate: roleCan(role, 'dataset', 'read-private'),
		editMetadata: mayChange,
		// Uploading (sites, logs, files) also needs a confirmed e-mail address.
		upload: roleMayUpload && viewer.emailVerified,
		/** Delete any file of the dataset; without it only one's own uploads. */
		deleteAnyFile: roleCan(role, 'dataset', 'delete'),
		/** Share it outside the organisation: answer requests, grant and revoke (sharing.ts). */
		answerRequests: roleCan(role, 'access', 'answer-request'),
		grant: roleCan(role, 'access', 'grant'),
		revoke: roleCan(role, 'access', 'revoke')
	};
	const uploadRefusal = can.upload
		? null
		: roleMayUpload
			? 'Confirm your e-mail address before you upload.'
			: d.status === 'published' || d.status === 'retired'
				? 'A published dataset is not changed in place.'
				: 'Your role does not allow adding data to this dataset now.';
	return { role, can, uploadRefusal };
}

export type DatasetRights = ReturnType<typeof datasetRights>;

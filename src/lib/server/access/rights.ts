import { roleCan } from '../permissions';
import type { Viewer } from './viewer';

/** The fields of a dataset its rights depend on. */
export interface DatasetState {
	organisationId: string;
	status: string;
	/** Set once a newer version is published: only the latest version is corrected. */
	supersededById?: string | null;
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
		revoke: roleCan(role, 'access', 'revoke'),
		/**
		 * Open a new draft version of the latest published version (versions.ts): whoever could
		 * add data to a draft of the organisation (upload right, confirmed address).
		 */
		correct:
			d.status === 'published' &&
			!d.supersededById &&
			roleCan(role, 'dataset', 'edit-draft') &&
			roleCan(role, 'upload', 'create') &&
			viewer.emailVerified,
		/** Delete the whole dataset: never once published (retire it instead). */
		deleteDataset:
			roleCan(role, 'dataset', 'delete') && d.status !== 'published' && d.status !== 'retired'
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

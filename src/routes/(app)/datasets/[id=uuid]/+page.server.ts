import { error, fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { citationFields } from '$lib/datasets/citation';
import {
	TRANSITION_NAMES,
	embargoDateRefusal,
	shareable,
	transitionRefusal,
	type TransitionName
} from '$lib/server/access';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import { mailTransition } from '$lib/server/lifecycle-mail';
import { listDatasetHistory } from '$lib/server/repositories/audit';
import {
	datasetForViewer,
	deleteUnpublishedDataset,
	listDatasetFiles,
	listDatasetImports,
	updateDatasetMetadata
} from '$lib/server/repositories/datasets';
import { lastReturnComment, transitionDataset } from '$lib/server/repositories/lifecycle';
import {
	catalogueEntry,
	grantableOrganisations,
	seesWholeDataset,
	sharingOverview
} from '$lib/server/repositories/sharing';
import { listDatasetSites } from '$lib/server/repositories/sites';
import { sharingActions } from './sharing-actions';
import {
	diffAgainstPrevious,
	openCorrection,
	versionLinks
} from '$lib/server/repositories/versions';
import { formValues, parseForm } from '$lib/schemas/form';
import { datasetSchema, transitionSchema } from '$lib/schemas/dataset';
import { parseSiteListQuery } from '$lib/sites/list-query';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals, url }) => {
	const db = getDb();
	// Not visible whole but a catalogue entry (restricted, under embargo): its public summary.
	if (!(await seesWholeDataset(db, locals.viewer, params.id))) {
		await catalogueEntry(db, locals.viewer, params.id);
		redirect(303, `/datasets/${params.id}/about`);
	}
	const found = await datasetForViewer(db, locals.viewer, params.id);
	const query = parseSiteListQuery(url.searchParams);
	const unpublished = !['published', 'retired'].includes(found.dataset.status);
	const [sites, files, imports, history, versions, diff] = await Promise.all([
		listDatasetSites(db, locals.viewer, params.id, query),
		listDatasetFiles(db, locals.viewer, params.id),
		listDatasetImports(db, locals.viewer, params.id),
		listDatasetHistory(db, locals.viewer, params.id),
		versionLinks(db, locals.viewer, found),
		// What a new version changes, read by the curator before publishing it.
		unpublished ? diffAgainstPrevious(db, locals.viewer, found) : null
	]);
	return {
		dataset: found.dataset,
		organisationName: found.organisationName,
		organisationSlug: found.organisationSlug,
		can: found.can,
		citation: citationFields(found.dataset, found.organisationName, url.origin),
		versions,
		diff,
		// The transitions this viewer may make now (the buttons shown).
		transitions: TRANSITION_NAMES.filter(
			(t) => transitionRefusal(locals.viewer, found.dataset, t) === null
		),
		returned:
			found.can.readPrivate && found.dataset.status === 'returned'
				? await lastReturnComment(db, params.id)
				: null,
		// Requests and grants: only published restricted or embargoed datasets take them.
		sharing: shareable(found.dataset) ? await sharingOverview(db, found) : null,
		grantOrganisations: found.can.grant ? await grantableOrganisations(db, found) : [],
		query,
		sites,
		files,
		imports,
		history: history.map((h) => ({
			at: h.at.toISOString(),
			action: h.action,
			actorName: h.actorName,
			comment: typeof h.details.comment === 'string' ? h.details.comment : null
		}))
	};
};

/** A lifecycle form action: 403 with a sentence from the wrong state or role, nothing changed. */
function transition(name: TransitionName) {
	return async (event: RequestEvent<{ id: string }>) => {
		const user = requireUser(event, 'action');
		const parsed = parseForm(transitionSchema, await event.request.formData());
		if (!parsed.ok) return fail(400, { ...parsed, form: 'lifecycle' });
		const db = getDb();
		const comment = parsed.data.comment;
		const result = await transitionDataset(db, event.locals.viewer, event.params.id, name, comment);
		if ('missingComment' in result) {
			return fail(400, {
				form: 'lifecycle',
				message:
					'Say what needs to change: returning a dataset needs a comment. Nothing was changed.'
			});
		}
		const found = await datasetForViewer(db, event.locals.viewer, event.params.id);
		await mailTransition(
			db,
			event.locals.viewer,
			user.name,
			{ ...result.dataset, organisationName: found.organisationName },
			name,
			comment
		);
		return { form: 'lifecycle', transitioned: name };
	};
}

export const actions: Actions = {
	update: async (event) => {
		requireUser(event, 'action');
		const db = getDb();
		const found = await datasetForViewer(db, event.locals.viewer, event.params.id);
		if (!found.can.editMetadata) error(403, 'Your role does not allow editing this dataset now.');
		const formData = await event.request.formData();
		const parsed = parseForm(datasetSchema, formData);
		if (!parsed.ok) return fail(400, parsed);
		const embargoRefusal = embargoDateRefusal(found.dataset, parsed.data);
		if (embargoRefusal)
			return fail(400, { errors: { embargoUntil: embargoRefusal }, values: formValues(formData) });
		if (!(await updateDatasetMetadata(db, event.locals.viewer, found, parsed.data)))
			error(403, 'The dataset changed state meanwhile; nothing was saved. Reload the page.');
		return { saved: true };
	},
	/** Open a new draft version of a published dataset (or the one already open) and go there. */
	correct: async (event) => {
		requireUser(event, 'action');
		const next = await openCorrection(getDb(), event.locals.viewer, event.params.id);
		redirect(303, `/datasets/${next.id}?correcting=${next.created ? 'new' : 'open'}`);
	},
	/** Delete a dataset never published; published ones are refused (retire them). */
	delete: async (event) => {
		requireUser(event, 'action');
		const gone = await deleteUnpublishedDataset(getDb(), event.locals.viewer, event.params.id);
		redirect(
			303,
			gone.previousVersionId
				? `/datasets/${gone.previousVersionId}`
				: `/organisations/${gone.organisationSlug}`
		);
	},
	submit: transition('submit'),
	return: transition('return'),
	publish: transition('publish'),
	retire: transition('retire'),
	...sharingActions
};

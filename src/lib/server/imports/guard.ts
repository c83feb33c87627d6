import { error, type RequestEvent } from '@sveltejs/kit';
import { getDb } from '../db';
import { requireUser } from '../guards';
import { datasetForViewer } from '../repositories/dataset-access';
import { importPayloadSchema } from './payload';

/** The signed-in, confirmed user may add sites to this dataset; returns the parsed import request. */
export async function requireUploader(event: RequestEvent, datasetId: string) {
	const user = requireUser(event, 'action');
	if (!user.emailVerified) error(403, 'Confirm your e-mail address before you upload.');
	const found = await datasetForViewer(getDb(), event.locals.viewer, datasetId);
	if (!found.can.upload) error(403, 'Your role does not allow adding sites to this dataset now.');
	const body = await event.request.json().catch(() => null);
	const parsed = importPayloadSchema.safeParse(body);
	if (!parsed.success) {
		error(
			400,
			`The upload could not be read: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`
		);
	}
	return { user, dataset: found.dataset, payload: parsed.data };
}

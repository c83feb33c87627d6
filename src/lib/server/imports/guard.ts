import { error, type RequestEvent } from '@sveltejs/kit';
import { getDb } from '../db';
import { requireUser } from '../guards';
import { datasetForViewer, requireUpload } from '../repositories/dataset-access';
import { importPayloadSchema } from './payload';

/** The signed-in, confirmed user may add sites to this dataset; returns the parsed import request. */
export async function requireUploader(event: RequestEvent, datasetId: string) {
	const user = requireUser(event, 'action');
	const found = await datasetForViewer(getDb(), event.locals.viewer, datasetId);
	requireUpload(found);
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

import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { startAttachmentUpload } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import type { RequestHandler } from './$types';

const body = z.object({
	datasetId: z.string().uuid('datasetId must be a dataset id'),
	siteId: z.string().uuid().nullish(),
	fileName: z.string().trim().min(1, 'fileName is empty').max(255),
	sizeBytes: z.number().int('sizeBytes must be a whole number of bytes')
});

/** Announce a file: returns its id and the path on this origin to PUT its bytes to. */
export const POST: RequestHandler = async (event) => {
	requireUser(event, 'action');
	const parsed = body.safeParse(await event.request.json().catch(() => null));
	if (!parsed.success)
		error(400, parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
	return json(await startAttachmentUpload(getDb(), event.locals.viewer, parsed.data), {
		status: 201
	});
};

import { apiHandler } from '$lib/server/api/http';
import { error, json } from '@sveltejs/kit';
import { attachmentStartSchema } from '$lib/api/schemas';
import { startAttachmentUpload } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import type { RequestHandler } from './$types';

/** Announce a file: returns its id and the path on this origin to PUT its bytes to. */
export const POST: RequestHandler = apiHandler(async (event) => {
	requireUser(event, 'action');
	const parsed = attachmentStartSchema.safeParse(await event.request.json().catch(() => null));
	if (!parsed.success)
		error(400, parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
	return json(await startAttachmentUpload(getDb(), event.locals.viewer, parsed.data), {
		status: 201
	});
});

import { apiHandler } from '$lib/server/api/http';
import { deleteAttachment } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import { requireUser } from '$lib/server/guards';
import type { RequestHandler } from './$types';

export const DELETE: RequestHandler = apiHandler(async (event) => {
	requireUser(event, 'action');
	await deleteAttachment(getDb(), event.locals.viewer, event.params.id);
	return new Response(null, { status: 204 });
});

import { apiHandler } from '$lib/server/api/http';
import { openAttachment } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** The file itself, streamed by the app after checking the viewer may see it. */
export const GET: RequestHandler = apiHandler(async ({ params, locals }) => {
	const { body, headers } = await openAttachment(getDb(), locals.viewer, params.id, 'file');
	return new Response(body, { headers });
});

/** The same answer without the bytes; the store's stream is closed at once, not left open. */
export const HEAD: RequestHandler = apiHandler(async ({ params, locals }) => {
	const { body, headers } = await openAttachment(getDb(), locals.viewer, params.id, 'file');
	await body.cancel();
	return new Response(null, { headers });
});

import { apiHandler } from '$lib/server/api/http';
import { openAttachment } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** The thumbnail of an image, through the same access check as the file. */
export const GET: RequestHandler = apiHandler(async ({ params, locals }) => {
	const { body, headers } = await openAttachment(getDb(), locals.viewer, params.id, 'thumbnail');
	return new Response(body, { headers });
});

/** The same answer without the bytes; the store's stream is closed at once, not left open. */
export const HEAD: RequestHandler = apiHandler(async ({ params, locals }) => {
	const { body, headers } = await openAttachment(getDb(), locals.viewer, params.id, 'thumbnail');
	await body.cancel();
	return new Response(null, { headers });
});

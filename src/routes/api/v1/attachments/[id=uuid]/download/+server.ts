import { redirect } from '@sveltejs/kit';
import { attachmentDownloadUrl } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** Redirect to a one-minute presigned link, after checking the viewer may see the file. */
export const GET: RequestHandler = async ({ params, locals, setHeaders }) => {
	setHeaders({ 'cache-control': 'no-store' });
	redirect(302, await attachmentDownloadUrl(getDb(), locals.viewer, params.id, 'file'));
};

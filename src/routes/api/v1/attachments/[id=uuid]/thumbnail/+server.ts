import { redirect } from '@sveltejs/kit';
import { attachmentDownloadUrl } from '$lib/server/attachments';
import { getDb } from '$lib/server/db';
import type { RequestHandler } from './$types';

/** The thumbnail of an image, through the same access check as the file. */
export const GET: RequestHandler = async ({ params, locals, setHeaders }) => {
	setHeaders({ 'cache-control': 'no-store' });
	redirect(302, await attachmentDownloadUrl(getDb(), locals.viewer, params.id, 'thumbnail'));
};

import { getDb } from '$lib/server/db';
import { siteDownload } from '$lib/server/repositories/downloads';
import type { RequestHandler } from './$types';

/** The dataset's sites as GeoJSON, with its citation, licence and version (downloads.ts). */
export const GET: RequestHandler = async ({ params, locals, url }) => {
	const d = await siteDownload(getDb(), locals.viewer, params.id, 'geojson', url.origin);
	return new Response(d.body, { headers: d.headers });
};

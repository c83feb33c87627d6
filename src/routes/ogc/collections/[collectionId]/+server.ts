import { getDb } from '$lib/server/db';
import { collection } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { NOT_FOUND, preflight } from '$lib/server/ogc/http';
import { parseCollectionId } from '$lib/server/ogc/params';
import { collectionFor } from '$lib/server/ogc/repository';

/** One collection; unknown, malformed and hidden ids get the same 404. */
export const GET = ogcGet(async ({ url, params, locals }) => {
	const ref = parseCollectionId(params.collectionId ?? '');
	const row = ref && (await collectionFor(getDb(), locals.viewer, ref, url.origin));
	return row ? collection(ogcBase(url), row) : NOT_FOUND;
});
export const OPTIONS = preflight;

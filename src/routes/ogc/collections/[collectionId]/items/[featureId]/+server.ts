import { getDb } from '$lib/server/db';
import { feature } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { NOT_FOUND, preflight } from '$lib/server/ogc/http';
import { parseCollectionId } from '$lib/server/ogc/params';
import { featureById } from '$lib/server/ogc/repository';

/** One feature of a collection; unknown, malformed and hidden ids get the same 404. */
export const GET = ogcGet(async ({ url, params, locals }) => {
	const ref = parseCollectionId(params.collectionId ?? '');
	const site = ref && (await featureById(getDb(), locals.viewer, ref, params.featureId ?? ''));
	return ref && site ? feature(ogcBase(url), ref, site) : NOT_FOUND;
});
export const OPTIONS = preflight;

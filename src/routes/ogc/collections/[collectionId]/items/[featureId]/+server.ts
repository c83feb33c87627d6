import { getDb } from '$lib/server/db';
import { feature } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { NOT_FOUND, invalidParameter, preflight } from '$lib/server/ogc/http';
import { FEATURE_PARAMETERS, crsRefusal, parseCollectionId } from '$lib/server/ogc/params';
import { featureById } from '$lib/server/ogc/repository';

/** One feature of a collection; unknown, malformed and hidden ids get the same 404. */
export const GET = ogcGet(async ({ url, params, locals }) => {
	const crs = crsRefusal(url.searchParams);
	if (crs) return invalidParameter(crs.parameter, crs.message);
	const ref = parseCollectionId(params.collectionId ?? '');
	const site = ref && (await featureById(getDb(), locals.viewer, ref, params.featureId ?? ''));
	return ref && site ? feature(ogcBase(url), ref, site) : NOT_FOUND;
}, FEATURE_PARAMETERS);
export const OPTIONS = preflight;

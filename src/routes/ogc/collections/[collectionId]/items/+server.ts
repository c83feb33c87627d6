import { getDb } from '$lib/server/db';
import { items } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { NOT_FOUND, invalidParameter, preflight } from '$lib/server/ogc/http';
import { ITEMS_PARAMETERS, parseCollectionId, parseItemsQuery } from '$lib/server/ogc/params';
import { collectionVisible, itemsPage } from '$lib/server/ogc/repository';

/** A page of features: bbox, datetime, limit, and next/prev links (keyset on the feature id). */
export const GET = ogcGet(async ({ url, params, locals }) => {
	const ref = parseCollectionId(params.collectionId ?? '');
	if (!ref || !(await collectionVisible(getDb(), locals.viewer, ref))) return NOT_FOUND;
	const query = parseItemsQuery(url.searchParams);
	if (!query.ok) return invalidParameter(query.parameter, query.message);
	const page = await itemsPage(getDb(), locals.viewer, ref, query.value);
	return items(ogcBase(url), ref, page, url.searchParams, query.value.limit);
}, ITEMS_PARAMETERS);
export const OPTIONS = preflight;

import { getDb } from '$lib/server/db';
import { collections } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { preflight } from '$lib/server/ogc/http';
import { collectionsFor } from '$lib/server/ogc/repository';

/** The collections the caller may see: all visible sites, and each visible published dataset. */
export const GET = ogcGet(async ({ url, locals }) =>
	collections(ogcBase(url), await collectionsFor(getDb(), locals.viewer, url.origin))
);
export const OPTIONS = preflight;

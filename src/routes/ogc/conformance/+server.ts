import { conformance } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { preflight } from '$lib/server/ogc/http';

/** The conformance classes this server implements (and its tests check). */
export const GET = ogcGet(async ({ url }) => conformance(ogcBase(url)));
export const OPTIONS = preflight;

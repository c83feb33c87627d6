import { apiDoc } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { preflight } from '$lib/server/ogc/http';

/** The human-readable API description, linked from the landing page as `service-doc`. */
export const GET = ogcGet(async ({ url }) => apiDoc(ogcBase(url)));
export const OPTIONS = preflight;

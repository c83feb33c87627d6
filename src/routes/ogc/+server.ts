import { landingPage } from '$lib/server/ogc/documents';
import { ogcBase, ogcGet } from '$lib/server/ogc/handler';
import { preflight } from '$lib/server/ogc/http';

/** OGC API – Features landing page: the address to give a GIS (README, "Desktop GIS"). */
export const GET = ogcGet(async ({ url }) => landingPage(ogcBase(url)));
export const OPTIONS = preflight;

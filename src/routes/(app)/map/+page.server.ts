import { env } from '$env/dynamic/public';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = () => ({
	// An online tile layer is optional; the offline Natural Earth basemap always works.
	tileUrl: env.PUBLIC_TILE_URL || null,
	tileAttribution: env.PUBLIC_TILE_ATTRIBUTION ?? ''
});

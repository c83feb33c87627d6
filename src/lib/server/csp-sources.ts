import { env as publicEnv } from '$env/dynamic/public';
import { cspSource } from './security-headers';

/**
 * Page CSP sources known only at run time (kit.csp is fixed at build time): the optional online
 * tile server of the map. The object store is not one: browsers send and fetch files through the
 * app's own routes only.
 */
export function runtimeCspSources() {
	const tiles = cspSource(publicEnv.PUBLIC_TILE_URL);
	return { 'connect-src': [] as string[], 'img-src': tiles ? [tiles] : [] };
}

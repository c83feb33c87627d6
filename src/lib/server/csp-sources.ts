import { env as publicEnv } from '$env/dynamic/public';
import { config } from './config';
import { cspSource } from './security-headers';

/**
 * Page CSP sources known only at run time (kit.csp is fixed at build time): the object store the
 * browser uploads to and loads thumbnails from, and the optional online tile server of the map.
 */
export function runtimeCspSources() {
	const c = config();
	const endpoint = cspSource(c.S3_ENDPOINT);
	// Virtual-hosted style puts the bucket in the host name (bucket.s3.example).
	const bucketHost =
		endpoint && c.S3_FORCE_PATH_STYLE === 'false' ? endpoint.replace('://', '://*.') : null;
	const storage = [endpoint, bucketHost].filter((s): s is string => s !== null);
	const tiles = cspSource(publicEnv.PUBLIC_TILE_URL);
	return { 'connect-src': storage, 'img-src': tiles ? [...storage, tiles] : storage };
}

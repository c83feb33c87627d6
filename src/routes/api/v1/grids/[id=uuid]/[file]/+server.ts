import { apiHandler } from '$lib/server/api/http';
import { getDb } from '$lib/server/db';
import { gridFile } from '$lib/server/grids/service';
import type { RequestHandler } from './$types';

/**
 * A download of a finished grid: heat-flow.tif, sigma.tif, grid.csv, contours.geojson,
 * heat-flow.png, sigma.png, temperature-at-depth.tif?depthM=, isotherm-depth.tif?temperatureC=,
 * and the at-depth map overlays temperature-at-depth.png?depthM=&band= and
 * isotherm-depth.png?temperatureC=&band=.
 */
export const GET: RequestHandler = apiHandler(async (event) => {
	const file = await gridFile(
		getDb(),
		event.locals.viewer,
		event.params.id,
		event.params.file,
		event.url.searchParams
	);
	const inline = file.type === 'image/png' || file.type.startsWith('application/geo+json');
	return new Response(typeof file.body === 'string' ? file.body : new Uint8Array(file.body), {
		headers: {
			'content-type': file.type,
			'content-disposition': `${inline ? 'inline' : 'attachment'}; filename="${file.fileName}"`,
			// A grid's access is checked per request (its datasets may be withdrawn): no shared caches.
			'cache-control': 'private, no-store'
		}
	});
});

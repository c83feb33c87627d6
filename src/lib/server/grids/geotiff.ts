import type { GridPlan } from '$lib/grids/plan';

/** The nodata value written for masked cells (GDAL_NODATA tag): outside any heat-flow range. */
export const NODATA = -9999;

/**
 * A single-band Float32 GeoTIFF of a grid in its computation CRS: north-up (GDAL row r is our
 * row ny − 1 − r), pixel-is-area, the EPSG code as ProjectedCSTypeGeoKey, the geotransform as
 * ModelTiepoint + ModelPixelScale, nodata in GDAL_NODATA. `description` goes to the TIFF
 * ImageDescription tag (kept short: the writer has a fixed-size directory).
 *
 * `geotiff` is imported when first used, not at load: its entry point pulls in a web-worker shim
 * that throws when loaded inside a Node worker thread, which is where SvelteKit's build analyses
 * the server code.
 */
export async function gridGeoTiff(
	cells: Float32Array | Float32Array[],
	plan: GridPlan,
	description: string
): Promise<Buffer> {
	const { writeArrayBuffer } = await import('geotiff');
	const bands = Array.isArray(cells) ? cells : [cells];
	const nb = bands.length;
	const { nx, ny, x0, y0, dx, dy } = plan.grid;
	// Pixel-interleaved (PlanarConfiguration 1): band values of one pixel side by side.
	const northUp = new Float32Array(nx * ny * nb);
	for (let r = 0; r < ny; r++) {
		const j = ny - 1 - r;
		for (let i = 0; i < nx; i++) {
			for (let b = 0; b < nb; b++) {
				const v = bands[b][j * nx + i];
				northUp[(r * nx + i) * nb + b] = Number.isNaN(v) ? NODATA : v;
			}
		}
	}
	const buffer = writeArrayBuffer(northUp, {
		width: nx,
		height: ny,
		ModelPixelScale: [dx, dy, 0],
		ModelTiepoint: [0, 0, 0, x0, y0 + ny * dy, 0],
		GTModelTypeGeoKey: 1,
		GTRasterTypeGeoKey: 1,
		ProjectedCSTypeGeoKey: plan.crs.epsg,
		GDAL_NODATA: String(NODATA),
		ImageDescription: description.slice(0, 400)
	} as unknown as Parameters<typeof writeArrayBuffer>[1]);
	return Buffer.from(buffer);
}

import { z } from 'zod';
import { parseSiteFilters, type SiteFilters } from '../sites/filters';
import { polygonBounds, regionPolygonSchema } from './region-polygon';

/**
 * The one schema of a grid request (`POST /api/v1/grids` and the map's grid panel). Checks that
 * need the projection (cell count) or the database (visible sites) come after it, in
 * `planGrid` (./plan.ts) and the server.
 */

/** Above this many cells a request is refused (memory and time of one job). */
export const MAX_REQUEST_CELLS = 4_000_000;
/** Fewer visible sites than this in the region cannot be gridded (kriging needs three). */
export const MIN_GRID_SITES = 3;
/**
 * Default kriging neighbourhood: with every site one (n + 1)² system per cell is far too slow
 * beyond a few thousand sites, and 24 is the usual local neighbourhood (common practice, no source).
 */
export const DEFAULT_KRIGING_NEIGHBOURS = 24;

const finite = (what: string) =>
	z
		.number({ error: `${what} must be a number` })
		.refine(Number.isFinite, `${what} must be a finite number`);

export const variogramInputSchema = z.object({
	model: z.enum(['spherical', 'exponential', 'gaussian'], {
		error: 'variogram.model must be spherical, exponential or gaussian'
	}),
	nuggetMWm2: finite('variogram.nuggetMWm2').pipe(
		z.number().min(0, 'variogram.nuggetMWm2 must be ≥ 0')
	),
	sillMWm2: finite('variogram.sillMWm2').pipe(
		z.number().positive('variogram.sillMWm2 must be > 0')
	),
	rangeM: finite('variogram.rangeM').pipe(z.number().positive('variogram.rangeM must be > 0'))
});
export type VariogramInput = z.output<typeof variogramInputSchema>;

export const gridRequestSchema = z
	.object({
		method: z.enum(['kriging', 'idw'], { error: 'method must be "kriging" or "idw"' }),
		bbox: z
			.array(z.number({ error: 'bbox must hold four numbers [west, south, east, north]' }), {
				error: 'bbox must be [west, south, east, north] in degrees'
			})
			.length(4, 'bbox must be [west, south, east, north] in degrees')
			.optional(),
		/**
		 * A drawn region: the grid covers its box (or `bbox` when given) and its overlays and
		 * downloads are empty outside it. Kept in the grid's stored request.
		 */
		polygon: regionPolygonSchema.optional(),
		/** A saved region's id: the server puts its polygon in `polygon` before this schema. */
		region: z.uuid('region must be a saved region’s id').optional(),
		cellSizeM: finite('cellSizeM').pipe(z.number().positive('cellSizeM must be > 0')),
		maskDistanceM: finite('maskDistanceM')
			.pipe(z.number().positive('maskDistanceM must be > 0'))
			.optional(),
		power: finite('power')
			.pipe(z.number().positive('power must be > 0').max(10, 'power must be ≤ 10'))
			.optional(),
		maxNeighbours: z
			.number({ error: 'maxNeighbours must be a whole number' })
			.int('maxNeighbours must be a whole number')
			.min(1, 'maxNeighbours must be ≥ 1')
			.max(500, 'maxNeighbours must be ≤ 500')
			.optional(),
		/** Sill here is the total sill (nugget + partial sill), in (mW/m²)². */
		variogram: variogramInputSchema.optional(),
		filters: z.record(z.string(), z.unknown()).optional()
	})
	.superRefine((r, ctx) => {
		if (r.region && r.polygon)
			ctx.addIssue({ code: 'custom', message: 'give polygon or region, not both' });
		if (!r.bbox && !r.polygon) {
			ctx.addIssue({
				code: 'custom',
				message:
					'give bbox [west, south, east, north], polygon [[lon, lat], …] or region (a saved region’s id)'
			});
			return;
		}
		const [w, s, e, n] = r.bbox ?? polygonBounds(r.polygon!);
		if (![w, s, e, n].every(Number.isFinite)) {
			ctx.addIssue({ code: 'custom', message: 'bbox must hold four finite numbers (no NaN)' });
			return;
		}
		if (w < -180 || e > 180 || s < -90 || n > 90)
			ctx.addIssue({
				code: 'custom',
				message: 'bbox must lie within ±180° longitude and ±90° latitude'
			});
		else if (w >= e)
			ctx.addIssue({
				code: 'custom',
				message:
					'bbox west must be less than east: regions crossing the antimeridian are not supported; request each side separately'
			});
		if (s >= n) ctx.addIssue({ code: 'custom', message: 'bbox south must be less than north' });
		if (r.variogram && r.variogram.nuggetMWm2 >= r.variogram.sillMWm2)
			ctx.addIssue({
				code: 'custom',
				message: 'variogram.sillMWm2 must be greater than the nugget'
			});
	})
	.transform(({ region: _region, ...r }) => ({
		...r,
		bbox: r.bbox ?? polygonBounds(r.polygon!),
		power: r.power ?? 2,
		filters: filtersFromJson(r.filters ?? {})
	}));

/**
 * The map's site filters from JSON, read exactly as the map reads them from its address (one
 * parser, $lib/sites/filters.ts), so a grid of "the active filters" uses the map's sites.
 */
function filtersFromJson(raw: Record<string, unknown>): Omit<SiteFilters, 'page'> {
	const params = new URLSearchParams();
	for (const [key, value] of Object.entries(raw)) {
		for (const v of Array.isArray(value) ? value : [value])
			if (v !== null && v !== undefined) params.append(key, String(v));
	}
	const { page: _page, ...rest } = parseSiteFilters(params);
	return rest;
}

export type GridRequest = z.output<typeof gridRequestSchema>;

/** The first problem of a bad request as one sentence. */
export function requestProblem(error: z.ZodError): string {
	const issue = error.issues[0];
	const where = issue.path.length ? issue.path.join('.') : '';
	const msg = issue.message;
	return where && !msg.startsWith(where.split('.')[0]) ? `${where}: ${msg}` : msg;
}

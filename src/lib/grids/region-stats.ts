import { z } from 'zod';
import type { GridSpec } from '../geostats';
import { DEFAULT_ISOTHERM_C, isothermDepthGrid } from './at-depth';
import {
	CRUST_MODELS,
	crustModelIdSchema,
	DEFAULT_CRUST_MODEL,
	type CrustModelId
} from './crust-models';
import type { GridPlan } from './plan';
import { projector } from './projection';
import { regionPolygonSchema } from './region-polygon';

export { MAX_REGION_VERTICES } from './region-polygon';

/**
 * Statistics of a finished grid inside a drawn region (a lon/lat rectangle or polygon): the
 * area-weighted mean and P10/P50/P90 of the surface heat flow and of the depth of an isotherm.
 *
 * Own code (science, no package does area-weighted grid statistics in a projected CRS): each
 * cell counts with the area of its square that lies inside the region, computed exactly by
 * clipping the region's projected polygon to the cell (Sutherland & Hodgman 1974, "Reentrant
 * polygon clipping", CACM 17(1); the clip window is convex, so the shoelace area of the result is
 * exact even for a concave region). Cells are squares of the computation CRS (UTM): areas are
 * UTM areas, within the projection's scale error of true areas (projection.ts).
 *
 * Percentiles are those of the area-weighted distribution: the smallest value whose cumulative
 * area reaches p of the covered area (the inverse of the empirical distribution function,
 * definition 1 of Hyndman & Fan 1996, "Sample quantiles in statistical packages", The American
 * Statistician 50(4), with weights). Empty (masked) cells, and cells where the isotherm is not
 * reached within the crust, are left out and their area reported.
 */

/** Points added along each edge before projecting: lon/lat lines are curves in UTM. */
const EDGE_POINTS = 16;

export const regionStatisticsRequestSchema = z
	.object({
		bbox: z
			.array(z.number().refine(Number.isFinite, 'bbox must hold four finite numbers'))
			.length(4, 'bbox must be [west, south, east, north] in degrees')
			.optional(),
		polygon: regionPolygonSchema.optional(),
		/** A saved region's id; the server turns it into its polygon (same access as the map). */
		region: z.uuid('region must be a saved region’s id').optional(),
		temperatureC: z
			.number({ error: 'temperatureC must be a number' })
			.min(20, 'temperatureC must be from 20 to 1000')
			.max(1000, 'temperatureC must be from 20 to 1000')
			.optional(),
		/** The crustal model of the isotherm depth (crust-models.ts); default continental. */
		crust: crustModelIdSchema.optional()
	})
	.strict()
	.refine((r) => (r.bbox ? 1 : 0) + (r.polygon ? 1 : 0) + (r.region ? 1 : 0) === 1, {
		message:
			'give one of bbox [west, south, east, north], polygon [[lon, lat], …] or region (a saved region’s id)'
	})
	.refine(
		(r) =>
			!r.bbox ||
			(r.bbox[0] < r.bbox[2] &&
				r.bbox[1] < r.bbox[3] &&
				r.bbox[0] >= -180 &&
				r.bbox[2] <= 180 &&
				r.bbox[1] >= -90 &&
				r.bbox[3] <= 90),
		{
			message:
				'bbox must be [west, south, east, north] with west < east and south < north, in degrees'
		}
	);
export type RegionStatisticsRequest = z.output<typeof regionStatisticsRequestSchema>;

export interface WeightedSummary {
	/** Area of the cells with a value inside the region (m²). */
	coveredAreaM2: number;
	mean: number | null;
	p10: number | null;
	p50: number | null;
	p90: number | null;
}

export interface RegionStatistics {
	/** Area of the region that lies over the grid (m², UTM). */
	regionAreaM2: number;
	heatFlowMWm2: WeightedSummary;
	isothermDepthM: WeightedSummary & {
		temperatureC: number;
		crust: CrustModelId;
		notReachedAreaM2: number;
	};
}

type Ring = [number, number][];

function shoelace(ring: Ring): number {
	let a = 0;
	for (let k = 0, n = ring.length; k < n; k++) {
		const [x1, y1] = ring[k];
		const [x2, y2] = ring[(k + 1) % n];
		a += x1 * y2 - x2 * y1;
	}
	return Math.abs(a) / 2;
}

/** Keep the part of `ring` where sign·(coordinate axis) ≤ sign·limit (one half-plane). */
function clipHalf(ring: Ring, axis: 0 | 1, limit: number, keepBelow: boolean): Ring {
	const inside = (p: [number, number]) => (keepBelow ? p[axis] <= limit : p[axis] >= limit);
	const out: Ring = [];
	for (let k = 0, n = ring.length; k < n; k++) {
		const a = ring[k];
		const b = ring[(k + 1) % n];
		const ia = inside(a);
		const ib = inside(b);
		if (ia) out.push(a);
		if (ia !== ib) {
			const t = (limit - a[axis]) / (b[axis] - a[axis]);
			const p: [number, number] = [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
			p[axis] = limit;
			out.push(p);
		}
	}
	return out;
}

/**
 * Area of `ring` (projected metres) inside each cell of `grid`, as a sparse list of
 * [cell index, area m²] (row-major, south row first, as the stored cells).
 */
export function cellWeights(grid: GridSpec, ring: Ring): { index: number; areaM2: number }[] {
	const { x0, y0, dx, dy, nx, ny } = grid;
	let yMin = Infinity,
		yMax = -Infinity;
	for (const [, y] of ring) {
		yMin = Math.min(yMin, y);
		yMax = Math.max(yMax, y);
	}
	const j0 = Math.max(0, Math.floor((yMin - y0) / dy));
	const j1 = Math.min(ny - 1, Math.floor((yMax - y0) / dy));
	const out: { index: number; areaM2: number }[] = [];
	for (let j = j0; j <= j1; j++) {
		const ys = y0 + j * dy;
		const strip = clipHalf(clipHalf(ring, 1, ys, false), 1, ys + dy, true);
		if (strip.length < 3) continue;
		let xMin = Infinity,
			xMax = -Infinity;
		for (const [x] of strip) {
			xMin = Math.min(xMin, x);
			xMax = Math.max(xMax, x);
		}
		const i0 = Math.max(0, Math.floor((xMin - x0) / dx));
		const i1 = Math.min(nx - 1, Math.floor((xMax - x0) / dx));
		for (let i = i0; i <= i1; i++) {
			const xs = x0 + i * dx;
			const piece = clipHalf(clipHalf(strip, 0, xs, false), 0, xs + dx, true);
			if (piece.length < 3) continue;
			const areaM2 = shoelace(piece);
			if (areaM2 > 0) out.push({ index: j * nx + i, areaM2 });
		}
	}
	return out;
}

/** Area-weighted mean and P10/P50/P90 of `values` over the weighted cells; NaN cells left out. */
export function weightedSummary(
	values: ArrayLike<number>,
	weights: { index: number; areaM2: number }[]
): WeightedSummary {
	const kept = weights
		.map((w) => ({ v: values[w.index], a: w.areaM2 }))
		.filter((p) => Number.isFinite(p.v));
	const total = kept.reduce((s, p) => s + p.a, 0);
	if (kept.length === 0 || total <= 0)
		return { coveredAreaM2: 0, mean: null, p10: null, p50: null, p90: null };
	const mean = kept.reduce((s, p) => s + p.a * p.v, 0) / total;
	kept.sort((a, b) => a.v - b.v);
	const quantile = (p: number) => {
		// Relative tolerance so a cumulative area that equals p·total up to rounding counts as reaching it.
		const target = p * total * (1 - 1e-12);
		let cum = 0;
		for (const k of kept) {
			cum += k.a;
			if (cum >= target) return k.v;
		}
		return kept[kept.length - 1].v;
	};
	return { coveredAreaM2: total, mean, p10: quantile(0.1), p50: quantile(0.5), p90: quantile(0.9) };
}

/** The region as a projected ring: a bbox's edges (or a polygon's) densified, then projected. */
export function projectedRegion(plan: GridPlan, region: RegionStatisticsRequest): Ring {
	const corners: [number, number][] = region.bbox
		? [
				[region.bbox[0], region.bbox[1]],
				[region.bbox[2], region.bbox[1]],
				[region.bbox[2], region.bbox[3]],
				[region.bbox[0], region.bbox[3]]
			]
		: (region.polygon as [number, number][]);
	// A closed ring repeats its first vertex; drop the repeat.
	const open =
		corners.length > 3 &&
		corners[0][0] === corners[corners.length - 1][0] &&
		corners[0][1] === corners[corners.length - 1][1]
			? corners.slice(0, -1)
			: corners;
	const { forward } = projector(plan.crs);
	const ring: Ring = [];
	for (let k = 0; k < open.length; k++) {
		const [ax, ay] = open[k];
		const [bx, by] = open[(k + 1) % open.length];
		for (let t = 0; t < EDGE_POINTS; t++) {
			const f = t / EDGE_POINTS;
			ring.push(forward(ax + f * (bx - ax), ay + f * (by - ay)));
		}
	}
	return ring;
}

/** Statistics of a finished grid (heat flow and σ cells) inside a drawn region. */
export function gridRegionStatistics(
	plan: GridPlan,
	value: Float32Array,
	sigma: Float32Array | null,
	region: RegionStatisticsRequest
): RegionStatistics {
	const temperatureC = region.temperatureC ?? DEFAULT_ISOTHERM_C;
	const crust = region.crust ?? DEFAULT_CRUST_MODEL;
	const weights = cellWeights(plan.grid, projectedRegion(plan, region));
	const regionAreaM2 = weights.reduce((s, w) => s + w.areaM2, 0);
	const heatFlow = weightedSummary(value, weights);
	// Only the cells in the region: the geotherm per cell is the costly part.
	const sub = Float32Array.from(weights, (w) => value[w.index]);
	const subSigma = sigma ? Float32Array.from(weights, (w) => sigma[w.index]) : null;
	const depth = isothermDepthGrid(sub, subSigma, temperatureC, CRUST_MODELS[crust]).p50;
	const local = weights.map((w, k) => ({ index: k, areaM2: w.areaM2 }));
	let notReachedAreaM2 = 0;
	for (let k = 0; k < local.length; k++)
		if (Number.isFinite(sub[k]) && !Number.isFinite(depth[k])) notReachedAreaM2 += local[k].areaM2;
	return {
		regionAreaM2,
		heatFlowMWm2: heatFlow,
		isothermDepthM: { ...weightedSummary(depth, local), temperatureC, crust, notReachedAreaM2 }
	};
}

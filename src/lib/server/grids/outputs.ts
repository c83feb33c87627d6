import sharp from 'sharp';
import Papa from 'papaparse';
import type { Feature, FeatureCollection, MultiPolygon, Position } from 'geojson';
import { contourGrid, contoursToProjected, type GridSpec } from '$lib/geostats';
import type { GridPlan } from '$lib/grids/plan';
import { projector } from '$lib/grids/projection';
import { sigmaColour } from '$lib/grids/sigma-scale';
import { heatFlowColour } from '$lib/map/heat-flow-scale';

export interface GridSource {
	title: string;
	version: number;
	citation: string;
	doi: string | null;
	licence: string;
	organisation: string;
}

/** One line per dataset: how to cite it and under which licence. */
export function sourceLine(s: GridSource): string {
	const cite = s.citation || `${s.organisation}: ${s.title}, version ${s.version}`;
	return `${cite}${s.doi ? ` https://doi.org/${s.doi}` : ''} (licence: ${s.licence})`;
}

/** The grid's lon/lat bounds: its projected extent's edges, densified, taken back to WGS 84. */
export function gridBoundsWgs84(plan: GridPlan): [number, number, number, number] {
	const { inverse } = projector(plan.crs);
	const { x0, y0, dx, dy, nx, ny } = plan.grid;
	const x1 = x0 + nx * dx;
	const y1 = y0 + ny * dy;
	let w = Infinity,
		s = Infinity,
		e = -Infinity,
		n = -Infinity;
	for (let k = 0; k <= 32; k++) {
		const t = k / 32;
		for (const [x, y] of [
			[x0 + t * (x1 - x0), y0],
			[x0 + t * (x1 - x0), y1],
			[x0, y0 + t * (y1 - y0)],
			[x1, y0 + t * (y1 - y0)]
		]) {
			const [lon, lat] = inverse(x, y);
			w = Math.min(w, lon);
			e = Math.max(e, lon);
			s = Math.min(s, lat);
			n = Math.max(n, lat);
		}
	}
	return [w, s, e, n];
}

/**
 * Cells as CSV: one row per cell with its centre in the computation CRS and in WGS 84, the heat
 * flow and σ (empty when masked). Leading `#` lines say what it is and cite every dataset that
 * shaped it (read with e.g. pandas `comment='#'`).
 */
export function gridCsv(
	plan: GridPlan,
	value: Float32Array,
	sigma: Float32Array | null,
	header: string[],
	sources: GridSource[]
): string {
	const { inverse } = projector(plan.crs);
	const { x0, y0, dx, dy, nx, ny } = plan.grid;
	const lines = [
		...header.map((h) => `# ${h}`),
		'# Sources (citation and licence of every dataset whose sites shaped this grid):',
		...sources.map((s) => `# - ${sourceLine(s)}`)
	].map((l) => l.replace(/[\r\n]+/g, ' '));
	const rows: (string | number)[][] = [];
	for (let j = 0; j < ny; j++) {
		const y = y0 + (j + 0.5) * dy;
		for (let i = 0; i < nx; i++) {
			const x = x0 + (i + 0.5) * dx;
			const [lon, lat] = inverse(x, y);
			const v = value[j * nx + i];
			const sg = sigma ? sigma[j * nx + i] : NaN;
			rows.push([
				x.toFixed(1),
				y.toFixed(1),
				lon.toFixed(6),
				lat.toFixed(6),
				Number.isNaN(v) ? '' : v.toFixed(3),
				Number.isNaN(sg) ? '' : sg.toFixed(3)
			]);
		}
	}
	const body = Papa.unparse({
		fields: [
			`x_m_epsg${plan.crs.epsg}`,
			`y_m_epsg${plan.crs.epsg}`,
			'lon_wgs84',
			'lat_wgs84',
			'heat_flow_mw_m2',
			'sigma_mw_m2'
		],
		data: rows
	});
	return `${lines.join('\n')}\n${body}\n`;
}

/** Thresholds of the contour bands: the map's heat-flow class breaks that fall in the grid's range. */
export const CONTOUR_THRESHOLDS_MWM2 = [40, 55, 70, 85, 100, 120];

/** Filled heat-flow contour bands as RFC 7946 GeoJSON (WGS 84 lon/lat), value = band's lower bound. */
export function gridContours(plan: GridPlan, value: Float32Array): FeatureCollection<MultiPolygon> {
	const grid: GridSpec = plan.grid;
	const projected = contoursToProjected(contourGrid(value, grid, CONTOUR_THRESHOLDS_MWM2), grid);
	const { inverse } = projector(plan.crs);
	const toLonLat = (p: Position): Position => {
		const [lon, lat] = inverse(p[0], p[1]);
		return [Number(lon.toFixed(6)), Number(lat.toFixed(6))];
	};
	return {
		type: 'FeatureCollection',
		features: projected.features
			.filter((f) => f.geometry.coordinates.length > 0)
			.map((f): Feature<MultiPolygon> => ({
				type: 'Feature',
				properties: { heatFlowMinMWm2: f.properties.value },
				geometry: {
					type: 'MultiPolygon',
					coordinates: f.geometry.coordinates.map((poly) => poly.map((ring) => ring.map(toLonLat)))
				}
			}))
	};
}

/** Longest side of the overlay image in pixels (a screen's worth). */
const OVERLAY_MAX_PX = 768;

const mercY = (latDeg: number) => Math.log(Math.tan(Math.PI / 4 + (latDeg * Math.PI) / 360));
const latOfMercY = (y: number) => (Math.atan(Math.sinh(y)) * 180) / Math.PI;

function rgb(hex: string): [number, number, number] {
	const n = parseInt(hex.slice(1), 16);
	return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/**
 * The overlay for the web map: a PNG in Web Mercator (the map's CRS) covering `bounds`, each
 * pixel the colour of the grid cell under it (nearest cell), transparent where masked or
 * outside; heat flow in the site markers' classes, σ in the σ classes, or any other cells
 * (the at-depth overlays) in the colours `band` gives.
 */
export async function gridOverlayPng(
	plan: GridPlan,
	cells: Float32Array,
	band: 'value' | 'sigma' | ((v: number) => string),
	bounds: [number, number, number, number]
): Promise<Buffer> {
	const [w, s, e, n] = bounds;
	const spanX = e - w;
	const spanY = ((mercY(n) - mercY(s)) * 180) / Math.PI;
	const scale = OVERLAY_MAX_PX / Math.max(spanX, spanY);
	const width = Math.max(1, Math.round(spanX * scale));
	const height = Math.max(1, Math.round(spanY * scale));
	const { forward } = projector(plan.crs);
	const { x0, y0, dx, dy, nx, ny } = plan.grid;
	const rgba = Buffer.alloc(width * height * 4);
	const colour =
		typeof band === 'function' ? band : band === 'value' ? heatFlowColour : sigmaColour;
	const cache = new Map<string, [number, number, number]>();
	const my0 = mercY(n);
	const my1 = mercY(s);
	for (let r = 0; r < height; r++) {
		const lat = latOfMercY(my0 + ((r + 0.5) / height) * (my1 - my0));
		for (let c = 0; c < width; c++) {
			const lon = w + ((c + 0.5) / width) * spanX;
			const [x, y] = forward(lon, lat);
			const i = Math.floor((x - x0) / dx);
			const j = Math.floor((y - y0) / dy);
			if (i < 0 || j < 0 || i >= nx || j >= ny) continue;
			const v = cells[j * nx + i];
			if (Number.isNaN(v)) continue;
			const hex = colour(v);
			let col = cache.get(hex);
			if (!col) cache.set(hex, (col = rgb(hex)));
			const o = (r * width + c) * 4;
			rgba[o] = col[0];
			rgba[o + 1] = col[1];
			rgba[o + 2] = col[2];
			rgba[o + 3] = 255;
		}
	}
	return sharp(rgba, { raw: { width, height, channels: 4 } })
		.png()
		.toBuffer();
}

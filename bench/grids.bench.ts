/// <reference types="node" />
/*
 * Grid job benchmark: `npm run bench -- grids` (or `npx tsx bench/grids.bench.ts`).
 * What a grid job does after its site query, timed as one: 5,000 invented sites (seeded, with σ)
 * in lon/lat → projected to the region's UTM zone → variogram fit, leave-one-out
 * cross-validation and a 256 × 256 ordinary-kriging grid with σ (24 neighbours) → both GeoTIFFs
 * written with the geotiff package. The site query and HTTP are not included (one indexed
 * query; tests/integration/grids.spec.ts covers the path end to end).
 */
import { computeGrid } from '../src/lib/grids/compute';
import { projector, chooseCrs } from '../src/lib/grids/projection';
import { gridRequestSchema } from '../src/lib/grids/request';
import { gridGeoTiff } from '../src/lib/server/grids/geotiff';
import { createRandom } from '../src/lib/foundation/random';
import { dryRun, figure, size } from './report';

const N = size(5000, 200);
const CELLS = size(256, 16);
const BBOX = [7, 58, 9, 59] as const;
const rnd = createRandom(2026).uniform;
const crs = chooseCrs(BBOX);
if (!crs.ok) throw new Error(crs.error);
const { forward } = projector(crs.crs);

const sites = Array.from({ length: N }, () => {
	const lon = BBOX[0] + rnd() * (BBOX[2] - BBOX[0]);
	const lat = BBOX[1] + rnd() * (BBOX[3] - BBOX[1]);
	const value = 65 + 15 * Math.sin(lon * 3) * Math.cos(lat * 5) + 4 * (rnd() - 0.5);
	return { lon, lat, value, sigma: 2 + 4 * rnd() };
});

const t0 = performance.now();
const samples = sites.map((s) => {
	const [x, y] = forward(s.lon, s.lat);
	return { x, y, value: s.value, sigma: s.sigma };
});
let xMin = Infinity,
	yMin = Infinity,
	xMax = -Infinity,
	yMax = -Infinity;
for (const s of samples) {
	xMin = Math.min(xMin, s.x);
	xMax = Math.max(xMax, s.x);
	yMin = Math.min(yMin, s.y);
	yMax = Math.max(yMax, s.y);
}
const cell = Math.max(xMax - xMin, yMax - yMin) / CELLS;
const grid = { x0: xMin, y0: yMin, dx: cell, dy: cell, nx: CELLS, ny: CELLS };
const req = gridRequestSchema.parse({
	method: 'kriging',
	bbox: BBOX,
	cellSizeM: cell,
	maxNeighbours: 24
});
const cpu0 = process.cpuUsage();
// Stage times from the progress reports: 0.05 after the variogram, 0.15 after the
// cross-validation, 1 after the grid and its mask.
const marks: Record<string, number> = {};
const tProject = performance.now();
const out = await computeGrid(samples, grid, req, async (f) => {
	if (f === 0.05) marks.variogram = performance.now();
	else if (f === 0.15) marks.crossValidation = performance.now();
	else if (f === 1) marks.grid = performance.now();
	// As the worker does between strips: give the event loop a turn.
	await new Promise((r) => setImmediate(r));
});
const plan = { crs: crs.crs, grid };
const tif = await gridGeoTiff(out.value, plan, 'bench');
const sigmaTif = await gridGeoTiff(out.sigma!, plan, 'bench');
const ms = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
const cpuMs = (cpu.user + cpu.system) / 1000;
const stages =
	`projection ${(tProject - t0).toFixed(0)} ms, variogram ${(marks.variogram - tProject).toFixed(0)} ms, ` +
	`cross-validation ${(marks.crossValidation - marks.variogram).toFixed(0)} ms, ` +
	`grid ${(marks.grid - marks.crossValidation).toFixed(0)} ms, ` +
	`GeoTIFFs ${(t0 + ms - marks.grid).toFixed(0)} ms`;
console.log(`stages: ${stages}; process CPU time ${cpuMs.toFixed(0)} ms`);
if (tif.length < CELLS * CELLS * 4 || sigmaTif.length < CELLS * CELLS * 4)
	throw new Error('GeoTIFF too small');
console.log(
	`${N} sites → ${CELLS} × ${CELLS} kriging grid with σ and both GeoTIFFs: ${ms.toFixed(0)} ms`
);

figure({
	id: 'grids.kriging-5000-256-geotiff',
	label: `${N} sites → ${CELLS}² kriging grid with σ (24 neighbours), fit, cross-validation, two GeoTIFFs`,
	value: ms,
	unit: 'ms',
	better: 'lower',
	...(dryRun ? {} : { target: 3000 }),
	note: `one run; site query and HTTP not included; ${stages}`
});

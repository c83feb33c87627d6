/// <reference types="node" />
/*
 * Grid job IDW and at-depth benchmark: `npm run bench -- grids-idw-depth` (or
 * `npx tsx bench/grids-idw-depth.bench.ts`).
 * 1. The grid job's IDW with every site (no maxNeighbours): 5,000 invented sites (seeded) in lon/lat
 *    → projected to the region's UTM zone → computeGrid (IDW power 2 over the 256 × 256 grid,
 *    leave-one-out cross-validation) on the grid threads and on one thread (best of 3 each,
 *    alternating) — against GDAL's `gdal_grid -a invdist:power=2` on the same projected points
 *    and the same grid, in the same run (whole-process wall time, one run).
 * 2. A 1,000 × 1,000 isotherm-depth grid (150 °C, P10/P50/P90 from σ) from a heat-flow grid.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { isothermDepthGrid } from '../src/lib/grids/at-depth';
import { computeGrid, type ComputeGridOptions } from '../src/lib/grids/compute';
import { gridThreadCount, idwThreads } from '../src/lib/server/grids/idw-threads';
import { chooseCrs, projector } from '../src/lib/grids/projection';
import { gridRequestSchema } from '../src/lib/grids/request';
import { createRandom } from '../src/lib/foundation/random';
import { dryRun, figure, size, type Peer } from './report';

const N = size(5000, 200);
const CELLS = size(256, 16);
const DEPTH_SIDE = size(1000, 20);
const BBOX = [7, 58, 9, 59] as const;
const rnd = createRandom(2027).uniform;
const crs = chooseCrs(BBOX);
if (!crs.ok) throw new Error(crs.error);
const { forward } = projector(crs.crs);

const samples = Array.from({ length: N }, () => {
	const lon = BBOX[0] + rnd() * (BBOX[2] - BBOX[0]);
	const lat = BBOX[1] + rnd() * (BBOX[3] - BBOX[1]);
	const [x, y] = forward(lon, lat);
	const value = 65 + 15 * Math.sin(lon * 3) * Math.cos(lat * 5) + 4 * (rnd() - 0.5);
	return { x, y, value };
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
// Whole metres, so gdal_grid's -txe/-tye carry the same extent exactly.
const cell = Math.ceil(Math.max(xMax - xMin, yMax - yMin) / CELLS);
const x0 = Math.floor(xMin);
const y0 = Math.floor(yMin);
const grid = { x0, y0, dx: cell, dy: cell, nx: CELLS, ny: CELLS };
const req = gridRequestSchema.parse({ method: 'idw', bbox: BBOX, cellSizeM: cell, power: 2 });

/** One whole computeGrid, as the job runs it; stages split at the cross-validation's end. */
async function timed(options: ComputeGridOptions) {
	const t0 = performance.now();
	let cvDone = t0;
	const out = await computeGrid(
		samples,
		grid,
		req,
		async (f) => {
			if (f === 0.15) cvDone = performance.now();
			await new Promise((r) => setImmediate(r));
		},
		options
	);
	const ms = performance.now() - t0;
	const stages = `cross-validation ${(cvDone - t0).toFixed(0)} ms, grid ${(t0 + ms - cvDone).toFixed(0)} ms`;
	return { out, ms, stages };
}
// The job's path: row strips on THERMALITH_GRID_THREADS threads (default min(2, cores)); and
// the same on this one thread, for comparison. The two grids must be bit-identical.
const THREADS = gridThreadCount();
// Best of REPEATS each, alternating, so both paths meet the same load on a shared machine.
const REPEATS = size(3, 1);
type Timed = Awaited<ReturnType<typeof timed>>;
let single: Timed | null = null;
let threaded: Timed | null = null;
for (let r = 0; r < REPEATS; r++) {
	const a = await timed({});
	if (!single || a.ms < single.ms) single = a;
	const b = await timed({ idwStrips: idwThreads(THREADS) });
	if (!threaded || b.ms < threaded.ms) threaded = b;
}
if (!single || !threaded) throw new Error('no run');
if (!threaded.out.value.every((v, c) => Object.is(v, single.out.value[c])))
	throw new Error('threaded grid differs from one thread');
const out = threaded.out;
for (const [name, r] of [
	['one thread', single],
	[`${THREADS} threads`, threaded]
] as const) {
	console.log(
		`IDW, every site, ${name}: ${N} sites → ${CELLS} × ${CELLS}: ${r.ms.toFixed(0)} ms (${r.stages})`
	);
}

const GDAL = 'gdal_grid invdist:power=2:smoothing=0';
let peer: Peer;
if (spawnSync('gdal_grid', ['--version']).status !== 0) {
	peer = { name: GDAL, reason: 'gdal_grid is not installed (Debian package gdal-bin)' };
} else {
	const dir = mkdtempSync(join(tmpdir(), 'grids-idw-bench-'));
	try {
		const csv = join(dir, 'pts.csv');
		writeFileSync(
			csv,
			'x,y,value\n' + samples.map((s) => `${s.x},${s.y},${s.value}`).join('\n') + '\n'
		);
		const vrt = join(dir, 'pts.vrt');
		writeFileSync(
			vrt,
			`<OGRVRTDataSource><OGRVRTLayer name="pts"><SrcDataSource>${csv}</SrcDataSource>` +
				'<GeometryType>wkbPoint</GeometryType>' +
				'<GeometryField encoding="PointFromColumns" x="x" y="y" z="value"/></OGRVRTLayer></OGRVRTDataSource>'
		);
		const tif = join(dir, 'idw.tif');
		const version = execFileSync('gdal_grid', ['--version'], { encoding: 'utf8' })
			.trim()
			.replace(/,.*$/, '');
		const g0 = performance.now();
		execFileSync(
			'gdal_grid',
			[
				'-q',
				'-a',
				'invdist:power=2:smoothing=0',
				'-txe',
				String(x0),
				String(x0 + CELLS * cell),
				'-tye',
				String(y0),
				String(y0 + CELLS * cell),
				'-outsize',
				String(CELLS),
				String(CELLS),
				'-ot',
				'Float64',
				'-l',
				'pts',
				vrt,
				tif
			],
			{ stdio: 'ignore' }
		);
		const gdalMs = performance.now() - g0;
		// Same cells? GDAL rows are north-up: its row r is our row ny − 1 − r.
		const xyz = join(dir, 'cmp.xyz');
		execFileSync('gdal_translate', ['-q', '-of', 'XYZ', '-co', 'DECIMAL_PRECISION=12', tif, xyz]);
		let worst = 0;
		readFileSync(xyz, 'utf8')
			.trim()
			.split('\n')
			.forEach((line, k) => {
				const z = Number(line.split(/\s+/)[2]);
				const i = k % CELLS;
				const j = CELLS - 1 - Math.floor(k / CELLS);
				worst = Math.max(worst, Math.abs(out.value[j * CELLS + i] - z) / Math.abs(z));
			});
		peer = {
			name: `${version} ${GDAL}`,
			value: gdalMs,
			note: `one whole run incl. start-up and CSV read; largest relative difference ${worst.toExponential(1)} (ours stored as float32)`
		};
	} catch (err) {
		peer = { name: GDAL, reason: `gdal_grid failed: ${(err as Error).message.split('\n')[0]}` };
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}
figure({
	id: 'grids.idw-all-5000-256-threads',
	label: `Grid job IDW power 2 with every site, ${N} sites → ${CELLS}², ${THREADS} thread${THREADS > 1 ? 's' : ''} (with leave-one-out cross-validation)`,
	value: threaded.ms,
	unit: 'ms',
	better: 'lower',
	note: `best of ${REPEATS}, alternating with one thread (${threaded.stages}); bit-identical to one thread; target: at most 3× gdal_grid invdist on the same points and grid`,
	peers: [peer]
});
figure({
	id: 'grids.idw-all-5000-256',
	label: `Grid job IDW power 2 with every site, ${N} sites → ${CELLS}², one thread (with leave-one-out cross-validation)`,
	value: single.ms,
	unit: 'ms',
	better: 'lower',
	note: `best of ${REPEATS}, alternating (${single.stages})`,
	peers: [peer]
});

// 2. Isotherm depth over a million cells, with σ (P10/P50/P90).
const cells = DEPTH_SIDE * DEPTH_SIDE;
const value = new Float32Array(cells);
const sigma = new Float32Array(cells);
for (let c = 0; c < cells; c++) {
	value[c] = 40 + 80 * rnd();
	sigma[c] = 2 + 8 * rnd();
}
const d0 = performance.now();
const depth = isothermDepthGrid(value, sigma, 150);
const depthMs = performance.now() - d0;
if (!Number.isFinite(depth.p50[0]) && !Number.isFinite(depth.p50[1]))
	throw new Error('isotherm depths are not finite');
console.log(`Isotherm depth, ${cells.toLocaleString('en')} cells: ${depthMs.toFixed(0)} ms`);
figure({
	id: 'grids.isotherm-depth-1m',
	label: `Depth of 150 °C with P10/P50/P90 over ${cells.toLocaleString('en')} cells`,
	value: depthMs,
	unit: 'ms',
	better: 'lower',
	...(dryRun ? {} : { target: 2000 }),
	note: 'one run'
});

/// <reference types="node" />
/*
 * Geostatistics benchmark: `npm run bench -- geostats` (or `npx tsx bench/geostats.bench.ts`).
 * 5,000 invented samples (seeded) on a 100 km square → a 256 × 256 grid by ordinary kriging
 * (24 neighbours) and IDW (all samples; 24 neighbours), and the same IDW by GDAL's gdal_grid as
 * a peer (process wall time, input CSV/VRT written to a temp dir). `npm run bench` installs
 * gdal-bin when it can; otherwise the GDAL ratios are reported as not measured, with the reason.
 * docs/geostats-bench.md holds earlier detailed figures.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
	crossValidate,
	fitVariogram,
	inverseDistanceGrid,
	ordinaryKrigingGrid,
	type GridSpec,
	type Sample,
	type Variogram
} from '../src/lib/geostats/index';
import { MAX_VARIOGRAM_PAIRS } from '../src/lib/geostats/empirical';
import { idwRows } from '../src/lib/geostats/idw';
import { gridThreadCount, idwThreads } from '../src/lib/server/grids/idw-threads';
import { createRandom } from '../src/lib/foundation/random';
import { figure, size, type Peer } from './report';

const N = size(5000, 200);
const SIDE_M = 100_000;
const CELLS = size(256, 16);
const REPEATS = size(3, 1);
const grid: GridSpec = {
	x0: 0,
	y0: 0,
	dx: SIDE_M / CELLS,
	dy: SIDE_M / CELLS,
	nx: CELLS,
	ny: CELLS
};
const rnd = createRandom(2024).uniform;
const samples: Sample[] = Array.from({ length: N }, () => {
	const x = rnd() * SIDE_M;
	const y = rnd() * SIDE_M;
	const value = 65 + 15 * Math.sin(x / 9000) * Math.cos(y / 13000) + 4 * (rnd() - 0.5);
	return { x, y, value };
});
const variogram: Variogram = { model: 'spherical', nugget: 1, partialSill: 60, rangeM: 30_000 };

function time<T>(f: () => T, repeats = REPEATS): { ms: number; result: T } {
	let best = Infinity;
	let result!: T;
	for (let r = 0; r < repeats; r++) {
		const t0 = performance.now();
		result = f();
		best = Math.min(best, performance.now() - t0);
	}
	return { ms: best, result };
}

console.log(`${N} samples → ${grid.nx} × ${grid.ny} grid`);

const ok = time(() => ordinaryKrigingGrid(samples, grid, variogram, { maxNeighbours: 24 }));
const idwAll = time(() => inverseDistanceGrid(samples, grid, { power: 2 }));
// The grid job's path: the same kernel in row strips of 16 on THERMALITH_GRID_THREADS threads
// (default min(2, cores)), thread start-up included, result checked bit for bit against idwAll.
const THREADS = gridThreadCount();
const threadedRunner = idwThreads(THREADS);
const idwThreaded = { ms: Infinity, result: new Float64Array(0) };
for (let r = 0; r < REPEATS; r++) {
	const t0 = performance.now();
	const rows = idwRows(samples, grid, { power: 2 });
	const out = new Float64Array(grid.nx * grid.ny);
	if (threadedRunner) await threadedRunner(rows.everySitePower2!, grid, 16, out, async () => {});
	else rows(0, grid.ny, out);
	idwThreaded.ms = Math.min(idwThreaded.ms, performance.now() - t0);
	idwThreaded.result = out;
}
if (!idwThreaded.result.every((v, c) => Object.is(v, idwAll.result[c])))
	throw new Error('threaded IDW differs from one thread');
const idw24 = time(() => inverseDistanceGrid(samples, grid, { power: 2, maxNeighbours: 24 }));
// GDAL's invdistnn needs a search radius; 8 km holds ~100 samples here, so 24 are always found.
const idwNnR = time(() =>
	inverseDistanceGrid(samples, grid, { power: 2, maxNeighbours: 24, radiusM: 8000 })
);
const fit = time(() => fitVariogram(samples, { model: 'spherical' }), 1);
const fitPairs = (N * (N - 1)) / 2;
const cv = time(() => crossValidate(samples, variogram, { maxNeighbours: 24 }), 1);
if (!ok.result.sigma.every(Number.isFinite)) throw new Error('kriging σ is not finite');

/** The GDAL peers, keyed by which of our figures they are compared with. */
const peers: Record<'idwAll' | 'idwThreaded' | 'idwNnR', Peer[]> = {
	idwAll: [],
	idwThreaded: [],
	idwNnR: []
};
const GDAL_ALL = 'gdal_grid invdist:power=2 (its default SIMD path)';
const GDAL_ALL_SCALAR = 'gdal_grid invdist:power=2 with GDAL_USE_AVX/SSE=NO';
const GDAL_NN = 'gdal_grid invdistnn:power=2:radius=8000:max_points=24';

function gdalMissing(): string | null {
	const probe = spawnSync('gdal_grid', ['--version'], { encoding: 'utf8' });
	if (probe.status === 0) return null;
	// scripts/bench.js says why it could not install gdal-bin; run alone, say what to install.
	return (
		process.env.THERMALITH_BENCH_GDAL_MISSING ??
		'gdal_grid is not installed (Debian package gdal-bin)'
	);
}

const missing = gdalMissing();
if (missing) {
	peers.idwAll.push(
		{ name: GDAL_ALL, reason: missing },
		{ name: GDAL_ALL_SCALAR, reason: missing }
	);
	peers.idwThreaded.push({ name: GDAL_ALL, reason: missing });
	peers.idwNnR.push({ name: GDAL_NN, reason: missing });
} else {
	const dir = mkdtempSync(join(tmpdir(), 'geostats-bench-'));
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
		// -txe/-tye are extent edges; gdal_grid's cell centres then equal ours.
		const gdal = (label: string, alg: string, config: string[] = [], cells = CELLS) => {
			const out = join(dir, `${label}.tif`);
			const args = [
				...config,
				'-q',
				'-a',
				alg,
				'-txe',
				'0',
				String(SIDE_M),
				'-tye',
				'0',
				String(SIDE_M),
				'-outsize',
				String(cells),
				String(cells),
				'-ot',
				'Float64',
				'-l',
				'pts',
				vrt,
				out
			];
			let best = Infinity;
			for (let r = 0; r < REPEATS; r++) {
				const t0 = performance.now();
				execFileSync('gdal_grid', args, { stdio: 'ignore' });
				best = Math.min(best, performance.now() - t0);
			}
			return { ms: best, out };
		};
		/** Max |ours − GDAL| / |GDAL| over the grid (GDAL rows are north-up: row r is our ny−1−r). */
		const compare = (ours: Float64Array, tif: string): number => {
			const xyz = join(dir, 'cmp.xyz');
			execFileSync('gdal_translate', ['-q', '-of', 'XYZ', '-co', 'DECIMAL_PRECISION=12', tif, xyz]);
			const rows = readFileSync(xyz, 'utf8').trim().split('\n');
			let worst = 0;
			rows.forEach((line: string, k: number) => {
				const z = Number(line.split(/\s+/)[2]);
				const i = k % grid.nx;
				const j = grid.ny - 1 - Math.floor(k / grid.nx);
				worst = Math.max(worst, Math.abs(ours[j * grid.nx + i] - z) / Math.abs(z));
			});
			return worst;
		};
		const version = execFileSync('gdal_grid', ['--version'], { encoding: 'utf8' })
			.trim()
			.replace(/,.*$/, '');
		const overhead = gdal('startup', 'invdist:power=2:smoothing=0', [], 1);
		const all = gdal('invdist', 'invdist:power=2:smoothing=0');
		const allScalar = gdal('invdist_nosimd', 'invdist:power=2:smoothing=0', [
			'--config',
			'GDAL_USE_AVX',
			'NO',
			'--config',
			'GDAL_USE_SSE',
			'NO'
		]);
		const nn = gdal('invdistnn', 'invdistnn:power=2:smoothing=0:radius=8000:max_points=24');
		/** Whole-process wall time, so GDAL's start-up and CSV read are part of its figure. */
		const peer = (name: string, g: { ms: number; out: string }, ours: Float64Array): Peer => ({
			name: `${version} ${name}`,
			value: g.ms,
			note:
				`best of ${REPEATS} whole runs incl. ${overhead.ms.toFixed(0)} ms start-up + CSV read; ` +
				`largest relative difference ${compare(ours, g.out).toExponential(1)}`
		});
		peers.idwAll.push(
			peer(GDAL_ALL, all, idwAll.result),
			peer(GDAL_ALL_SCALAR, allScalar, idwAll.result)
		);
		peers.idwThreaded.push(peer(GDAL_ALL, all, idwThreaded.result));
		peers.idwNnR.push(peer(GDAL_NN, nn, idwNnR.result));
	} catch (err) {
		// A failing peer leaves our figures standing; its ratio is reported as not measured.
		const reason = `gdal_grid failed: ${(err as Error).message.split('\n')[0]}`;
		peers.idwAll = [GDAL_ALL, GDAL_ALL_SCALAR].map((name) => ({ name, reason }));
		peers.idwThreaded = [{ name: GDAL_ALL, reason }];
		peers.idwNnR = [{ name: GDAL_NN, reason }];
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

const shape = `${N.toLocaleString('en')} samples → ${CELLS} × ${CELLS}`;
const best = `best of ${REPEATS}`;
figure({
	id: 'geostats.kriging-24',
	label: `Ordinary kriging, ${shape}, 24 neighbours (value and σ)`,
	value: ok.ms,
	unit: 'ms',
	target: 5000,
	better: 'lower',
	note: best
});
figure({
	id: 'geostats.idw-all',
	label: `IDW power 2, ${shape}, all samples, one thread`,
	value: idwAll.ms,
	unit: 'ms',
	better: 'lower',
	note: best,
	peers: peers.idwAll
});
figure({
	id: 'geostats.idw-all-threads',
	label: `IDW power 2, ${shape}, all samples, ${THREADS} thread${THREADS > 1 ? 's' : ''} (the grid job's path)`,
	value: idwThreaded.ms,
	unit: 'ms',
	better: 'lower',
	note: `${best}, thread start-up included; bit-identical to one thread; target: at most 3× gdal_grid invdist`,
	peers: peers.idwThreaded
});
figure({
	id: 'geostats.idw-24',
	label: `IDW power 2, ${shape}, 24 neighbours`,
	value: idw24.ms,
	unit: 'ms',
	better: 'lower',
	note: best
});
figure({
	id: 'geostats.idw-24-8km',
	label: `IDW power 2, ${shape}, 24 neighbours within 8 km`,
	value: idwNnR.ms,
	unit: 'ms',
	better: 'lower',
	note: best,
	peers: peers.idwNnR
});
figure({
	id: 'geostats.variogram-fit',
	// Above MAX_VARIOGRAM_PAIRS the empirical variogram bins a seeded subsample of the pairs.
	label: `Variogram fit, spherical, ${
		fitPairs > MAX_VARIOGRAM_PAIRS
			? `a ${(MAX_VARIOGRAM_PAIRS / 1e6).toLocaleString('en')} M-pair sample of ${(fitPairs / 1e6).toFixed(1)} M pairs`
			: `all ${fitPairs.toLocaleString('en')} pairs`
	}`,
	value: fit.ms,
	unit: 'ms',
	better: 'lower',
	note: 'one run'
});
figure({
	id: 'geostats.cross-validate',
	label: `Leave-one-out cross-validation, ${N.toLocaleString('en')} samples, 24 neighbours`,
	value: cv.ms,
	unit: 'ms',
	better: 'lower',
	note: 'one run'
});

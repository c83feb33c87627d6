/// <reference types="node" />
/*
 * Geostatistics benchmark: run with `npx tsx bench/geostats.bench.ts`.
 * 5,000 invented samples (seeded) on a 100 km square → a 256 × 256 grid by ordinary kriging
 * (24 neighbours) and IDW (all samples; 24 neighbours), and the same IDW by GDAL's gdal_grid
 * when it is installed (process wall time, input CSV/VRT written to a temp dir).
 * Results feed docs/geostats-bench.md.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, tmpdir } from 'node:os';
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
import { createRandom } from '../src/lib/foundation/random';

const N = 5000;
const SIDE_M = 100_000;
const grid: GridSpec = { x0: 0, y0: 0, dx: SIDE_M / 256, dy: SIDE_M / 256, nx: 256, ny: 256 };
const rnd = createRandom(2024).uniform;
const samples: Sample[] = Array.from({ length: N }, () => {
	const x = rnd() * SIDE_M;
	const y = rnd() * SIDE_M;
	const value = 65 + 15 * Math.sin(x / 9000) * Math.cos(y / 13000) + 4 * (rnd() - 0.5);
	return { x, y, value };
});
const variogram: Variogram = { model: 'spherical', nugget: 1, partialSill: 60, rangeM: 30_000 };

function time<T>(label: string, f: () => T, repeats = 3): { ms: number; result: T } {
	let best = Infinity;
	let result!: T;
	for (let r = 0; r < repeats; r++) {
		const t0 = performance.now();
		result = f();
		best = Math.min(best, performance.now() - t0);
	}
	console.log(`${label.padEnd(52)} ${best.toFixed(0).padStart(7)} ms (best of ${repeats})`);
	return { ms: best, result };
}

console.log(`Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'unknown CPU'}`);
console.log(`${N} samples → ${grid.nx} × ${grid.ny} grid\n`);

const ok = time('ordinary kriging, 24 neighbours', () =>
	ordinaryKrigingGrid(samples, grid, variogram, { maxNeighbours: 24 })
);
const idwAll = time('IDW power 2, all samples', () =>
	inverseDistanceGrid(samples, grid, { power: 2 })
);
time('IDW power 2, 24 neighbours', () =>
	inverseDistanceGrid(samples, grid, { power: 2, maxNeighbours: 24 })
);
// GDAL's invdistnn needs a search radius; 8 km holds ~100 samples here, so 24 are always found.
const idwNnR = time('IDW power 2, 24 neighbours within 8 km', () =>
	inverseDistanceGrid(samples, grid, { power: 2, maxNeighbours: 24, radiusM: 8000 })
);
time(
	'fitVariogram spherical (default lags, 12.5 M pairs)',
	() => fitVariogram(samples, { model: 'spherical' }),
	1
);
time(
	'crossValidate, 24 neighbours',
	() => crossValidate(samples, variogram, { maxNeighbours: 24 }),
	1
);
console.log(
	`kriging σ range: ${Math.min(...ok.result.sigma).toFixed(3)} … ${Math.max(...ok.result.sigma).toFixed(3)}`
);

function hasGdal(): boolean {
	return spawnSync('gdal_grid', ['--version'], { encoding: 'utf8' }).status === 0;
}

if (!hasGdal()) {
	console.log('\ngdal_grid not found (apt-get install gdal-bin): GDAL ratios skipped.');
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
		const gdal = (label: string, alg: string, config: string[] = [], size = 256) => {
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
				String(size),
				String(size),
				'-ot',
				'Float64',
				'-l',
				'pts',
				vrt,
				out
			];
			let best = Infinity;
			for (let r = 0; r < 3; r++) {
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
		console.log(
			`\ngdal_grid (${execFileSync('gdal_grid', ['--version'], { encoding: 'utf8' }).trim()}), process wall time, best of 3:`
		);
		console.log(
			`  startup + CSV read (1 × 1 grid)            ${overhead.ms.toFixed(0).padStart(7)} ms`
		);
		const row = (
			label: string,
			g: { ms: number; out: string },
			ours: { ms: number; result: Float64Array }
		) =>
			console.log(
				`  ${label.padEnd(42)} ${g.ms.toFixed(0).padStart(7)} ms; ours/GDAL = ${(ours.ms / g.ms).toFixed(2)}` +
					` (${(ours.ms / Math.max(1, g.ms - overhead.ms)).toFixed(2)} without startup); max rel diff ${compare(ours.result, g.out).toExponential(1)}`
			);
		row('invdist power 2 (default, SIMD)', all, idwAll);
		row('invdist power 2 (GDAL_USE_AVX/SSE=NO)', allScalar, idwAll);
		row('invdistnn power 2 radius=8000 max_points=24', nn, idwNnR);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

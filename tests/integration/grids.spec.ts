/**
 * Heat-flow grids end to end on the real queue and database: request, progress, result, cache,
 * what an outsider's grid is made of, the GeoTIFF as the geotiff package and GDAL read it, and
 * refusals. Demo scenario: Korvald survey (public) and Skarnholt wells (embargoed) in one region.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { and, eq, like } from 'drizzle-orm';
import { fromArrayBuffer } from 'geotiff';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { grid as gridTable, site } from '../../src/lib/server/db/schema';
import { computeGrid } from '../../src/lib/grids/compute';
import type { GridPlan } from '../../src/lib/grids/plan';
import type { GridRequest } from '../../src/lib/grids/request';
import type { GridSample } from '../../src/lib/server/repositories/grids';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';
import { USER_RATE_RULES } from '../../src/lib/server/auth/rate-rules';
import { NOT_REACHED_COLOUR, VIRIDIS_7 } from '../../src/lib/grids/at-depth-scale';

const run = promisify(execFile);
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });

/** The eastern half of the demo region: Korvald survey boreholes and the embargoed Skarnholt wells. */
const BBOX = [8.4, 58.9, 10.2, 60.1];
const REQUEST = { method: 'kriging', bbox: BBOX, cellSizeM: 4000, maskDistanceM: 60_000 };

const anonymous = new Client();
let member: Client;
let tmp: string;
/** The embargoed well whose value the member changes, and its value before. */
let hidden: { id: string; heatFlowMWm2: number | null };

beforeAll(async () => {
	member = await signIn('owner@skarnholt.example', DEMO_PASSWORD);
	tmp = await mkdtemp(path.join(tmpdir(), 'grids-'));
	const [row] = await db
		.select({ id: site.id, heatFlowMWm2: site.heatFlowMWm2 })
		.from(site)
		.where(like(site.code, 'SKH-001'));
	hidden = row;
});

afterAll(async () => {
	await db.update(site).set({ heatFlowMWm2: hidden.heatFlowMWm2 }).where(eq(site.id, hidden.id));
	await sql.end();
	await rm(tmp, { recursive: true, force: true });
});

/** Poll the status document until the job ends, keeping every progress value seen. */
async function waitForGrid(client: Client, id: string) {
	const progress: number[] = [];
	for (let i = 0; i < 600; i++) {
		const res = await client.get(`/api/v1/grids/${id}`);
		expect(res.status).toBe(200);
		const body = await res.json();
		progress.push(body.progress);
		if (body.status === 'done' || body.status === 'failed') return { body, progress };
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error('grid did not finish');
}

async function post(client: Client, body: unknown) {
	const res = await client.json('/api/v1/grids', body);
	return { res, body: await res.json() };
}

async function download(client: Client, url: string): Promise<Buffer> {
	const res = await client.get(url);
	expect(res.status).toBe(200);
	return Buffer.from(await res.arrayBuffer());
}

/** Sites an anonymous visitor sees in BBOX with a heat flow (the map's own query). */
async function publicSiteCount(): Promise<number> {
	const res = await fetch(`${testEnv.appUrl()}/api/v1/sites.geojson?bbox=${BBOX.join(',')}`);
	const fc = await res.json();
	return fc.features.filter(
		(f: { properties: { heatFlowMWm2: number | null } }) => f.properties.heatFlowMWm2 !== null
	).length;
}

describe('an IDW grid with every site, computed by the built server on its grid threads', () => {
	it('equals the same grid computed on one thread here, cell for cell', async () => {
		const { body } = await post(anonymous, { method: 'idw', bbox: BBOX, cellSizeM: 3100 });
		const done = await waitForGrid(anonymous, body.id);
		expect(done.body.status).toBe('done');
		expect(done.body.progress).toBe(1);
		const [row] = await db.select().from(gridTable).where(eq(gridTable.id, body.id));
		const plan = row.plan as unknown as GridPlan;
		const samples = (row.samples as GridSample[]).map((s) => ({
			x: s.x,
			y: s.y,
			value: s.heatFlowMWm2,
			...(s.sigmaMWm2 !== null && s.sigmaMWm2 > 0 ? { sigma: s.sigmaMWm2 } : {})
		}));
		const here = await computeGrid(samples, plan.grid, row.request as unknown as GridRequest);
		const tif = await download(anonymous, `/api/v1/grids/${body.id}/heat-flow.tif`);
		const image = await (await fromArrayBuffer(new Uint8Array(tif).buffer)).getImage();
		const [band] = (await image.readRasters()) as unknown as Float32Array[];
		const { nx, ny } = plan.grid;
		expect(band).toHaveLength(nx * ny);
		// The GeoTIFF is north-up: its row r is the grid's row ny − 1 − r.
		let same = 0;
		for (let j = 0; j < ny; j++) {
			for (let i = 0; i < nx; i++) {
				if (Object.is(band[(ny - 1 - j) * nx + i], here.value[j * nx + i])) same++;
			}
		}
		expect(same).toBe(nx * ny);
	});
});

describe('a kriging grid requested by an anonymous visitor', () => {
	let id: string;
	let status: Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

	it('is accepted with 202 and a Location, computed by the worker, and reports its result', async () => {
		const { res, body } = await post(anonymous, REQUEST);
		expect(res.status).toBe(202);
		expect(res.headers.get('location')).toBe(`/api/v1/grids/${body.id}`);
		id = body.id;
		const done = await waitForGrid(anonymous, id);
		status = done.body;
		expect(status.status).toBe('done');
		expect(done.progress.every((p) => p >= 0 && p <= 1)).toBe(true);
		expect(status.progress).toBe(1);
		// 9° E is in UTM zone 32 (6°–12° E), northern hemisphere.
		expect(status.crs).toEqual({ epsg: 32632, name: 'WGS 84 / UTM zone 32N' });
		expect(status.sitesUsed).toBe(await publicSiteCount());
		expect(status.variogram.sillMWm2).toBeGreaterThan(status.variogram.nuggetMWm2);
		expect(['fitted', 'default']).toContain(status.variogram.source);
		expect(status.measurementError).toMatch(/counted twice/);
		expect(status.crossValidation.rmseMWm2).toBeGreaterThan(0);
		expect(Number.isFinite(status.crossValidation.meanStandardisedError)).toBe(true);
		expect(status.crossValidation.pairs).toHaveLength(status.sitesUsed);
		expect(status.links.sigmaGeotiff).toBe(`/api/v1/grids/${id}/sigma.tif`);
		expect(status.caution).toMatch(/licensed professional/);
	});

	it('is served from the cache for the same request over the same visible data', async () => {
		const { res, body } = await post(anonymous, REQUEST);
		expect(res.status).toBe(202);
		expect(body).toMatchObject({ id, cached: true });
	});

	it('writes a GeoTIFF the geotiff package reads back: CRS, geotransform, nodata, values', async () => {
		const tif = await download(anonymous, `/api/v1/grids/${id}/heat-flow.tif`);
		const image = await (await fromArrayBuffer(new Uint8Array(tif).buffer)).getImage();
		const geoKeys = image.getGeoKeys()!;
		const g = status.grid;
		expect(image.getWidth()).toBe(g.nx);
		expect(image.getHeight()).toBe(g.ny);
		expect(geoKeys.ProjectedCSTypeGeoKey).toBe(32632);
		expect(image.getOrigin().slice(0, 2)).toEqual([g.x0, g.y0 + g.ny * g.dy]);
		expect(image.getResolution().slice(0, 2)).toEqual([g.dx, -g.dy]);
		expect(image.getGDALNoData()).toBe(-9999);
		const [band] = (await image.readRasters()) as unknown as Float32Array[];
		// The CSV lists cells south row first; the GeoTIFF is north-up.
		const csv = (await (await anonymous.get(`/api/v1/grids/${id}/grid.csv`)).text()).split('\n');
		const rows = csv.filter((l) => l && !l.startsWith('#')).slice(1);
		expect(rows).toHaveLength(g.nx * g.ny);
		let masked = 0;
		for (const k of [0, 7, Math.floor(rows.length / 2), rows.length - 1]) {
			const j = Math.floor(k / g.nx);
			const i = k % g.nx;
			const cell = rows[k].split(',')[4];
			const tiffValue = band[(g.ny - 1 - j) * g.nx + i];
			if (cell === '') {
				masked++;
				expect(tiffValue).toBe(-9999);
			} else expect(tiffValue).toBeCloseTo(Number(cell), 2);
		}
		expect(masked).toBeLessThan(4);
		expect(band.filter((v) => v === -9999).length).toBe(status.maskedCells);
	});

	it('writes a GeoTIFF GDAL reads: gdalinfo shows EPSG:32632, the geotransform, nodata and the value range', async () => {
		const file = path.join(tmp, 'heat-flow.tif');
		await writeFile(file, await download(anonymous, `/api/v1/grids/${id}/heat-flow.tif`));
		const { stdout } = await run('gdalinfo', ['-json', '-stats', file]);
		const info = JSON.parse(stdout);
		const g = status.grid;
		expect(info.size).toEqual([g.nx, g.ny]);
		expect(info.stac['proj:epsg']).toBe(32632);
		expect(info.coordinateSystem.wkt).toContain('UTM zone 32N');
		expect(info.geoTransform).toEqual([g.x0, g.dx, 0, g.y0 + g.ny * g.dy, 0, -g.dy]);
		const band = info.bands[0];
		expect(band.type).toBe('Float32');
		expect(band.noDataValue).toBe(-9999);
		expect(band.minimum).toBeCloseTo(status.valueRangeMWm2[0], 3);
		expect(band.maximum).toBeCloseTo(status.valueRangeMWm2[1], 3);
		// The σ grid: kriging's standard error is never negative.
		const sigmaFile = path.join(tmp, 'sigma.tif');
		await writeFile(sigmaFile, await download(anonymous, `/api/v1/grids/${id}/sigma.tif`));
		const sigma = JSON.parse((await run('gdalinfo', ['-json', '-stats', sigmaFile])).stdout);
		expect(sigma.bands[0].minimum).toBeGreaterThanOrEqual(0);
		expect(sigma.stac['proj:epsg']).toBe(32632);
	});

	it('derives temperature at 3 km and the depth of 150 °C as P10/P50/P90 GeoTIFF bands', async () => {
		const file = path.join(tmp, 'at-depth.tif');
		await writeFile(
			file,
			await download(anonymous, `/api/v1/grids/${id}/temperature-at-depth.tif?depthM=3000`)
		);
		const info = JSON.parse((await run('gdalinfo', ['-json', '-stats', file])).stdout);
		expect(info.bands).toHaveLength(3);
		expect(info.stac['proj:epsg']).toBe(32632);
		const [p10, p50, p90] = info.bands.map((b: { mean: number }) => b.mean);
		expect(p10).toBeLessThan(p50);
		expect(p50).toBeLessThan(p90);
		// 10 °C at the surface plus roughly 3 km × q/k: between 50 and 150 °C for 40–100 mW/m².
		expect(p50).toBeGreaterThan(50);
		expect(p50).toBeLessThan(150);
		const depthFile = path.join(tmp, 'isotherm.tif');
		await writeFile(
			depthFile,
			await download(anonymous, `/api/v1/grids/${id}/isotherm-depth.tif?temperatureC=150`)
		);
		const depth = JSON.parse((await run('gdalinfo', ['-json', '-stats', depthFile])).stdout);
		const [d10, d50, d90] = depth.bands.map((b: { mean: number }) => b.mean);
		expect(d10).toBeLessThan(d50);
		expect(d50).toBeLessThan(d90);
		expect(
			(await anonymous.get(`/api/v1/grids/${id}/isotherm-depth.tif?temperatureC=abc`)).status
		).toBe(400);
	});

	it('draws the at-depth results as map overlays in their legend classes; P90 is hotter than P10', async () => {
		/** The opaque pixels' colours of an overlay, and their mean luminance (Rec. 709 weights). */
		const pixels = async (url: string) => {
			const res = await anonymous.get(url);
			expect(res.status).toBe(200);
			expect(res.headers.get('content-type')).toBe('image/png');
			const { data, info } = await sharp(Buffer.from(await res.arrayBuffer()))
				.ensureAlpha()
				.raw()
				.toBuffer({ resolveWithObject: true });
			const colours = new Set<string>();
			let light = 0;
			let n = 0;
			for (let o = 0; o < info.width * info.height * 4; o += 4) {
				if (data[o + 3] === 0) continue;
				const hex = `#${[data[o], data[o + 1], data[o + 2]].map((v) => v.toString(16).padStart(2, '0')).join('')}`;
				colours.add(hex);
				// Cells where the isotherm is not reached (grey) are not in the gradient classes.
				if (hex === NOT_REACHED_COLOUR) continue;
				light += 0.2126 * data[o] + 0.7152 * data[o + 1] + 0.0722 * data[o + 2];
				n++;
			}
			expect(n).toBeGreaterThan(0);
			return { colours, light: light / n };
		};
		const base = `/api/v1/grids/${id}`;
		const t10 = await pixels(`${base}/temperature-at-depth.png?depthM=3000&band=p10`);
		const t90 = await pixels(`${base}/temperature-at-depth.png?depthM=3000&band=p90`);
		const legend = new Set<string>(VIRIDIS_7);
		for (const c of [...t10.colours, ...t90.colours]) expect(legend.has(c)).toBe(true);
		// Hotter is brighter in the legend, and P90 is the hot end.
		expect(t90.light).toBeGreaterThan(t10.light);
		const d50 = await pixels(`${base}/isotherm-depth.png?temperatureC=150&band=p50`);
		for (const c of d50.colours) expect(legend.has(c) || c === NOT_REACHED_COLOUR).toBe(true);
		// The classes follow the mean gradient down to the isotherm; the crust's heat production makes
		// the geotherm flatten with depth, so 400 °C lies in darker (lower-gradient) classes than 150 °C.
		const deep = await pixels(`${base}/isotherm-depth.png?temperatureC=400&band=p50`);
		expect(deep.light).toBeLessThan(d50.light);
		expect((await anonymous.get(`${base}/isotherm-depth.png?band=p99`)).status).toBe(400);
		expect((await anonymous.get(`${base}/temperature-at-depth.png?depthM=-5`)).status).toBe(400);
	});

	it('an IDW grid has no σ, so no P10/P90 at depth: a sentence, not an empty overlay', async () => {
		const { body } = await post(anonymous, { ...REQUEST, method: 'idw', cellSizeM: 20_000 });
		expect((await waitForGrid(anonymous, body.id)).body.status).toBe('done');
		const p90 = await anonymous.get(`/api/v1/grids/${body.id}/isotherm-depth.png?band=p90`);
		expect(p90.status).toBe(400);
		expect((await p90.json()).error.message).toMatch(/P50 only/);
		const p50 = await anonymous.get(`/api/v1/grids/${body.id}/isotherm-depth.png?band=p50`);
		expect(p50.headers.get('content-type')).toBe('image/png');
	});

	it('gives region statistics: over the whole grid, the mean and median of its cells; P10 ≤ P50 ≤ P90', async () => {
		const csv = (await (await anonymous.get(`/api/v1/grids/${id}/grid.csv`)).text()).split('\n');
		const cells = csv
			.filter((l) => l && !l.startsWith('#'))
			.slice(1)
			.map((l) => l.split(',')[4])
			.filter((v) => v !== '')
			.map(Number)
			.sort((a, b) => a - b);
		// The grid's lon/lat bounds enclose every cell, so each counts with its full (equal) area.
		const res = await anonymous.json(`/api/v1/grids/${id}/statistics`, {
			bbox: status.boundsWgs84
		});
		expect(res.status).toBe(200);
		const stats = await res.json();
		const mean = cells.reduce((a, b) => a + b, 0) / cells.length;
		expect(stats.heatFlowMWm2.mean).toBeCloseTo(mean, 2);
		expect(stats.heatFlowMWm2.p50).toBeCloseTo(cells[Math.ceil(cells.length / 2) - 1], 2);
		const g = status.grid;
		const area = cells.length * g.dx * g.dy;
		expect(Math.abs(stats.heatFlowMWm2.coveredAreaM2 - area) / area).toBeLessThan(1e-6);
		const d = stats.isothermDepthM;
		expect(d.temperatureC).toBe(150);
		expect(d.p10).toBeLessThanOrEqual(d.p50);
		expect(d.p50).toBeLessThanOrEqual(d.p90);
		// GET with a bbox answers the same.
		const viaGet = await (
			await anonymous.get(`/api/v1/grids/${id}/statistics?bbox=${status.boundsWgs84.join(',')}`)
		).json();
		expect(viaGet.heatFlowMWm2).toEqual(stats.heatFlowMWm2);
		const bad = await anonymous.json(`/api/v1/grids/${id}/statistics`, { bbox: [9, 60, 8, 59] });
		expect(bad.status).toBe(400);
		expect((await bad.json()).error.message).toMatch(/^Bad region: .*west < east/);
	});

	it('cites the datasets that shaped it (public survey only) in the CSV and the contours', async () => {
		const csv = await (await anonymous.get(`/api/v1/grids/${id}/grid.csv`)).text();
		expect(csv).toMatch(/# - .*Korvald.*\(licence: CC-BY-4\.0\)/);
		expect(csv).not.toContain('Skarnholt');
		const contours = await (await anonymous.get(`/api/v1/grids/${id}/contours.geojson`)).json();
		expect(contours.type).toBe('FeatureCollection');
		expect(contours.features.length).toBeGreaterThan(0);
		const [lon, lat] = contours.features[0].geometry.coordinates[0][0][0];
		expect(lon).toBeGreaterThan(7);
		expect(lat).toBeGreaterThan(58);
		const png = await anonymous.get(`/api/v1/grids/${id}/heat-flow.png`);
		expect(png.headers.get('content-type')).toBe('image/png');
		expect(
			Buffer.from(await png.arrayBuffer())
				.subarray(1, 4)
				.toString()
		).toBe('PNG');
	});

	it("ignores the embargoed wells: the member's grid differs, the outsider's is unchanged after a hidden value changes", async () => {
		const mine = await post(member, REQUEST);
		expect(mine.res.status).toBe(202);
		expect(mine.body.id).not.toBe(id);
		const memberDone = (await waitForGrid(member, mine.body.id)).body;
		expect(memberDone.sitesUsed).toBeGreaterThan(status.sitesUsed);
		// The member's grid is not shown to whoever may not see the wells.
		expect((await anonymous.get(`/api/v1/grids/${mine.body.id}`)).status).toBe(404);
		expect((await anonymous.get(`/api/v1/grids/${mine.body.id}/heat-flow.tif`)).status).toBe(404);
		// Nor are its statistics (the same access check as the grid).
		const region = { bbox: BBOX };
		expect((await member.json(`/api/v1/grids/${mine.body.id}/statistics`, region)).status).toBe(
			200
		);
		expect((await anonymous.json(`/api/v1/grids/${mine.body.id}/statistics`, region)).status).toBe(
			404
		);
		expect(
			(await anonymous.get(`/api/v1/grids/${mine.body.id}/statistics?bbox=${BBOX.join(',')}`))
				.status
		).toBe(404);

		const before = await download(anonymous, `/api/v1/grids/${id}/heat-flow.tif`);
		await db
			.update(site)
			.set({ heatFlowMWm2: (hidden.heatFlowMWm2 ?? 80) + 40 })
			.where(and(eq(site.id, hidden.id)));
		const again = await post(anonymous, REQUEST);
		expect(again.body).toMatchObject({ id, cached: true });
		expect((await download(anonymous, `/api/v1/grids/${id}/heat-flow.tif`)).equals(before)).toBe(
			true
		);
		// The member sees the change: a new grid.
		const changed = await post(member, REQUEST);
		expect(changed.body.cached).toBe(false);
		expect(changed.body.id).not.toBe(mine.body.id);
	});
});

describe('bad grid requests', () => {
	it.each([
		[
			'a bbox crossing the antimeridian',
			{ ...REQUEST, bbox: [170, -20, -170, -10] },
			/antimeridian/
		],
		['a bbox with NaN (null in JSON)', { ...REQUEST, bbox: [null, 58, 9, 59] }, /bbox/],
		['more than 4 million cells', { ...REQUEST, cellSizeM: 20 }, /at most 4,000,000/],
		['fewer than three visible sites', { ...REQUEST, bbox: [-40, -10, -39, -9] }, /at least 3/],
		['an unknown method', { ...REQUEST, method: 'spline' }, /method/],
		['a region wider than one UTM band allows', { ...REQUEST, bbox: [-10, 40, 30, 50] }, /wide/]
	])('%s: 400 with a sentence', async (_name, body, message) => {
		const { res, body: answer } = await post(anonymous, body);
		expect(res.status).toBe(400);
		expect(answer.error.message).toMatch(message);
		expect(answer.error.message).toMatch(/^Bad grid request: .+\.$/);
	});

	it('a body that is not JSON: 400', async () => {
		const res = await fetch(`${testEnv.appUrl()}/api/v1/grids`, {
			method: 'POST',
			headers: { 'content-type': 'application/json', origin: testEnv.appUrl() },
			body: '{"bbox": [NaN, 1, 2, 3]}'
		});
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/JSON/);
	});

	it('more new grids than the limit from one address: 429 with Retry-After; cached ones still answer', async () => {
		const caller = new Client();
		const distinct = (i: number) => ({ ...REQUEST, method: 'idw', cellSizeM: 30_000 + i * 100 });
		const max = USER_RATE_RULES['grid-job'].max;
		for (let i = 0; i < max; i++) expect((await post(caller, distinct(i))).res.status).toBe(202);
		const refused = await post(caller, distinct(max));
		expect(refused.res.status).toBe(429);
		expect(Number(refused.res.headers.get('retry-after'))).toBeGreaterThan(0);
		expect(refused.body.error.message).toMatch(/Too many new grids/);
		// A request for a grid that exists costs nothing and is not refused.
		expect((await post(caller, distinct(0))).body.cached).toBe(true);
	});

	it('an unknown download name or grid id: 404', async () => {
		const { body } = await post(anonymous, { ...REQUEST, method: 'idw', cellSizeM: 20_000 });
		expect((await anonymous.get(`/api/v1/grids/${body.id}/secrets.txt`)).status).toBe(404);
		expect((await anonymous.get(`/api/v1/grids/${crypto.randomUUID()}`)).status).toBe(404);
	});
});

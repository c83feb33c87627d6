/**
 * Grids of a drawn or saved region and their crustal models: a polygon grid is empty outside its
 * polygon in the overlay and the downloads, a saved region serves as the grid's region and as the
 * region of its statistics (another user's region is the one 404), and `crust=<id>` changes the
 * at-depth results (an unknown id is a 400 with a sentence). Demo data: the Korvald survey region.
 */
import { fromArrayBuffer } from 'geotiff';
import Papa from 'papaparse';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { Client, DEMO_PASSWORD, signIn } from './http';

const run = Date.now().toString(36);
/** A right triangle over the eastern half of the demo region; its box is the grids' bbox. */
const TRIANGLE = [
	[8.4, 58.9],
	[10.2, 58.9],
	[8.4, 60.1],
	[8.4, 58.9]
];
const BBOX = [8.4, 58.9, 10.2, 60.1];
const IDW = { method: 'idw', cellSizeM: 5000 };
/** Grid jobs share the one queue with other test files' grids: allow for waiting in it. */
const JOB_WAIT_MS = 180_000;

const anonymous = new Client();
let curator: Client;
let outsider: Client;
let regionId: string;

async function waitForGrid(client: Client, id: string) {
	for (let i = 0; i < 900; i++) {
		const body = await (await client.get(`/api/v1/grids/${id}`)).json();
		if (body.status === 'done' || body.status === 'failed') return body;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error('grid did not finish');
}

async function grid(client: Client, body: unknown) {
	const res = await client.json('/api/v1/grids', body);
	expect(res.status).toBe(202);
	const status = await waitForGrid(client, (await res.json()).id);
	expect(status.status).toBe('done');
	return status;
}

async function get(client: Client, url: string) {
	const res = await client.get(url);
	expect(res.status).toBe(200);
	return Buffer.from(await res.arrayBuffer());
}

/** One band of a GeoTIFF download (the first, or P50 = 1 of the at-depth files), nodata as NaN. */
async function cells(client: Client, url: string, band = 0): Promise<number[]> {
	const image = await (
		await fromArrayBuffer(new Uint8Array(await get(client, url)).buffer)
	).getImage();
	const nodata = image.getGDALNoData();
	const bands = (await image.readRasters()) as unknown as Float32Array[];
	return Array.from(bands[band], (v) => (v === nodata ? NaN : v));
}

async function opaquePixels(client: Client, url: string): Promise<number> {
	const { data } = await sharp(await get(client, url))
		.ensureAlpha()
		.raw()
		.toBuffer({ resolveWithObject: true });
	let n = 0;
	for (let o = 3; o < data.length; o += 4) if (data[o] > 0) n++;
	return n;
}

beforeAll(async () => {
	[curator, outsider] = await Promise.all([
		signIn('curator@korvald-survey.example', DEMO_PASSWORD),
		signIn('owner@lindmark-thermics.example', DEMO_PASSWORD)
	]);
	const res = await curator.json('/api/v1/regions', {
		name: `Grid triangle ${run}`,
		geometry: { type: 'Polygon', coordinates: [TRIANGLE] }
	});
	expect(res.status).toBe(201);
	regionId = (await res.json()).id;
});

describe('a grid of a saved polygon region', () => {
	let box: Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
	let clipped: Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

	it(
		'takes the saved polygon as its region and keeps it in its request',
		async () => {
			[box, clipped] = await Promise.all([
				grid(curator, { ...IDW, bbox: BBOX }),
				grid(curator, { ...IDW, region: regionId })
			]);
			expect(clipped.request.polygon).toEqual(TRIANGLE);
			expect(clipped.request.bbox).toEqual(BBOX);
			expect(clipped.request.region).toBeUndefined();
			expect(clipped.grid).toEqual(box.grid);
		},
		JOB_WAIT_MS
	);

	it('is empty outside the polygon in the GeoTIFF, CSV and overlay; inside it equals the box grid', async () => {
		const all = await cells(curator, box.links.geotiff);
		const part = await cells(curator, clipped.links.geotiff);
		expect(part).toHaveLength(all.length);
		const kept = part.filter((v) => !Number.isNaN(v)).length;
		// IDW without a mask fills every cell of the box; the triangle is about half of it.
		expect(all.every((v) => !Number.isNaN(v))).toBe(true);
		expect(kept / all.length).toBeGreaterThan(0.35);
		expect(kept / all.length).toBeLessThan(0.65);
		part.forEach((v, k) => {
			if (!Number.isNaN(v)) expect(v).toBeCloseTo(all[k], 4);
		});
		const csv = Papa.parse<Record<string, string>>(
			(await get(curator, clipped.links.csv))
				.toString('utf8')
				.split('\n')
				.filter((l) => !l.startsWith('#'))
				.join('\n'),
			{ header: true, skipEmptyLines: true }
		).data;
		expect(csv.filter((r) => r.heat_flow_mw_m2 !== '').length).toBe(kept);
		const opaqueBox = await opaquePixels(curator, box.links.png);
		const opaqueClipped = await opaquePixels(curator, clipped.links.png);
		expect(opaqueClipped).toBeGreaterThan(0.3 * opaqueBox);
		expect(opaqueClipped).toBeLessThan(0.7 * opaqueBox);
		// The at-depth files follow the same cells.
		const t = await cells(curator, `${clipped.links.temperatureAtDepth}&crust=basin`, 1);
		expect(t.filter((v) => !Number.isNaN(v)).length).toBe(kept);
	});

	it('refuses a region given with a polygon, and another user’s region is the one 404', async () => {
		const both = await curator.json('/api/v1/grids', {
			...IDW,
			region: regionId,
			polygon: TRIANGLE
		});
		expect(both.status).toBe(400);
		const theirs = await outsider.json('/api/v1/grids', { ...IDW, region: regionId });
		expect(theirs.status).toBe(404);
		expect((await theirs.json()).error.message).toBe(NOT_FOUND_MESSAGE);
	});
});

describe('region statistics of a grid by saved region', () => {
	let publicGrid: Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

	beforeAll(async () => {
		publicGrid = await grid(anonymous, { ...IDW, bbox: BBOX });
	}, JOB_WAIT_MS);

	it('answer for the owner exactly as for the same polygon drawn', async () => {
		const url = `/api/v1/grids/${publicGrid.id}/statistics`;
		const byId = await curator.json(url, { region: regionId });
		expect(byId.status).toBe(200);
		const drawn = await curator.json(url, { polygon: TRIANGLE });
		const a = await byId.json();
		expect(a).toEqual(await drawn.json());
		expect(a.regionAreaM2).toBeGreaterThan(0);
		const viaGet = await curator.get(`${url}?region=${regionId}`);
		expect(await viaGet.json()).toEqual(a);
	});

	it('are the one 404 for another user’s region, while the grid itself answers them', async () => {
		const url = `/api/v1/grids/${publicGrid.id}/statistics`;
		expect((await outsider.json(url, { bbox: BBOX })).status).toBe(200);
		const res = await outsider.json(url, { region: regionId });
		expect(res.status).toBe(404);
		expect((await res.json()).error.message).toBe(NOT_FOUND_MESSAGE);
		expect((await outsider.get(`${url}?region=${regionId}`)).status).toBe(404);
		expect((await curator.json(url, { region: regionId, bbox: BBOX })).status).toBe(400);
	});
});

describe('the crustal model of the at-depth results', () => {
	let status: Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any

	beforeAll(async () => {
		status = await grid(anonymous, { ...IDW, bbox: BBOX });
	}, JOB_WAIT_MS);

	it('changes temperature at depth and isotherm depth; the default is the continental crust', async () => {
		const base = `/api/v1/grids/${status.id}`;
		const mean = (v: number[]) => {
			const ok = v.filter((x) => !Number.isNaN(x));
			return ok.reduce((s, x) => s + x, 0) / ok.length;
		};
		const t = (crust: string) =>
			cells(anonymous, `${base}/temperature-at-depth.tif?depthM=3000${crust}`, 1).then(mean);
		const [plain, continental, basin, shield] = await Promise.all([
			t(''),
			t('&crust=continental'),
			t('&crust=basin'),
			t('&crust=shield')
		]);
		expect(continental).toBe(plain);
		// Less conductive sediment is hotter at 3 km; the more conductive shield crust is cooler.
		expect(basin).toBeGreaterThan(continental + 5);
		expect(shield).toBeLessThan(continental - 5);
		const d = (crust: string) =>
			cells(anonymous, `${base}/isotherm-depth.tif?temperatureC=150&crust=${crust}`, 1).then(mean);
		expect(await d('basin')).toBeLessThan(await d('continental'));
		const png = await anonymous.get(`${base}/isotherm-depth.png?temperatureC=150&crust=thin`);
		expect(png.status).toBe(200);
		expect(png.headers.get('content-type')).toBe('image/png');
	});

	it('an unknown crust or a depth below the chosen crust: 400 with a sentence', async () => {
		const base = `/api/v1/grids/${status.id}`;
		for (const url of [
			`${base}/temperature-at-depth.tif?crust=mantle`,
			`${base}/isotherm-depth.png?crust=mantle`
		]) {
			const res = await anonymous.get(url);
			expect(res.status).toBe(400);
			expect((await res.json()).error.message).toMatch(
				/^crust must be one of continental, thin, shield, basin; got mantle\.$/
			);
		}
		const deep = await anonymous.get(`${base}/temperature-at-depth.png?depthM=28000&crust=thin`);
		expect(deep.status).toBe(400);
		expect((await deep.json()).error.message).toMatch(/within the 25 km/);
		expect(
			(await anonymous.get(`${base}/temperature-at-depth.png?depthM=28000&crust=shield`)).status
		).toBe(200);
	});
});

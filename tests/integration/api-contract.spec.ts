import fs from 'node:fs';
import path from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { isFeatureCollection, valid } from 'geojson-validation';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { temperatureLog } from '../../src/lib/server/db/schema';
import { KeyClient, keyFor } from './api-key-client';
import { testEnv } from './env';
import { createDraftDataset, gridCsv } from './fixtures';
import { Client, DEMO_PASSWORD, signIn } from './http';
import { createOgcFixture, type OgcFixture } from './ogc-fixture';

/*
 * Contract: the OpenAPI document served at /api/v1/openapi.json is valid OpenAPI 3.1, names
 * every /api/v1 route, and every answer of those routes (successes, 304s and errors) validates
 * against the schema it documents for that status and media type.
 */

type Doc = {
	paths: Record<
		string,
		Record<string, { responses: Record<string, { content?: Record<string, unknown> }> }>
	>;
};

/** JSON bodies are validated against their schema; other media (files) by type only. */
const JSON_TYPES = new Set(['application/json', 'application/geo+json']);

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let doc: Doc;
let fixture: OgcFixture;
let script: KeyClient;
let writer: KeyClient;
let contributor: Client;
const anonymous = new Client();
const ajv = new Ajv2020({ strict: false, validateFormats: false, allErrors: true });

beforeAll(async () => {
	fixture = await createOgcFixture();
	script = new KeyClient((await keyFor(db, 'viewer@korvald-survey.example')).key);
	writer = new KeyClient(
		(await keyFor(db, 'viewer@korvald-survey.example', ['read', 'write'])).key
	);
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	await db.insert(temperatureLog).values({
		siteId: fixture.open.sites[0],
		name: 'contract log',
		depthM: [0, 50, 100],
		temperatureC: [8, 9.5, 11]
	});
	doc = await (await anonymous.json('/api/v1/openapi.json', undefined, 'GET')).json();
	ajv.addSchema({ ...doc, $id: 'openapi' });
});

afterAll(async () => {
	await fixture.close();
	await sql.end();
});

/** Check an answer against the document: its status must be listed and its body must fit. */
async function conforms(template: string, method: string, res: Response) {
	const operation = doc.paths[template]?.[method];
	expect(operation, `${method} ${template} is documented`).toBeDefined();
	const status = String(res.status);
	const documented = operation.responses[status];
	expect(documented, `${method} ${template} documents status ${status}`).toBeDefined();
	const type = (res.headers.get('content-type') ?? '').split(';')[0];
	if (!documented.content || method === 'head') return expect(await res.text()).toBe('');
	const media = Object.keys(documented.content);
	if (!JSON_TYPES.has(type)) {
		// A file: its type must be listed (or any type, `*/*`, for stored uploads), and never JSON.
		expect(media.includes(type) || media.includes('*/*'), `${template} ${status} ${type}`).toBe(
			true
		);
		expect((await res.arrayBuffer()).byteLength).toBeGreaterThan(0);
		return;
	}
	expect(media, `${template} ${status} ${type}`).toContain(type);
	const pointer = ['paths', template, method, 'responses', status, 'content', type, 'schema']
		.map((p) => p.replace(/~/g, '~0').replace(/\//g, '~1'))
		.join('/');
	const validate = ajv.getSchema(`openapi#/${pointer}`)!;
	const body = await res.json();
	const ok = validate(body);
	expect(validate.errors ?? [], `${method} ${template} ${status}`).toEqual([]);
	expect(ok).toBe(true);
}

describe('the OpenAPI document', () => {
	it('validates as OpenAPI 3.1', async () => {
		const validator = new Validator();
		const result = await validator.validate(
			structuredClone(doc) as unknown as Record<string, unknown>
		);
		expect(result.errors ?? []).toEqual([]);
		expect(validator.version).toBe('3.1');
	});

	it('names every route under /api/v1, and no other', () => {
		const root = path.resolve('src/routes/api/v1');
		const found: string[] = [];
		const walk = (dir: string) => {
			for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
				if (e.isDirectory()) walk(path.join(dir, e.name));
				else if (e.name === '+server.ts')
					found.push(
						'/' +
							path
								.relative(root, dir)
								.split(path.sep)
								.join('/')
								.replace(/\[(\w+)(=\w+)?\]/g, '{$1}')
					);
			}
		};
		walk(root);
		const documented = Object.keys(doc.paths);
		expect(found.length).toBeGreaterThan(20);
		expect([...documented].sort()).toEqual([...found].sort());
	});
});

describe('every answer fits the document', () => {
	const unknownId = '00000000-0000-4000-8000-000000000000';

	it('organisations and datasets', async () => {
		await conforms('/organisations', 'get', await script.fetch('/api/v1/organisations?limit=2'));
		await conforms('/organisations', 'get', await script.fetch('/api/v1/organisations?limit=0'));
		await conforms('/organisations', 'get', await script.fetch('/api/v1/organisations?cursor=%%%'));
		const datasets = await script.fetch('/api/v1/datasets?limit=3');
		const tag = datasets.headers.get('etag')!;
		await conforms('/datasets', 'get', datasets);
		await conforms('/datasets', 'get', await script.fetch('/api/v1/datasets?colour=red'));
		const again = await script.fetch('/api/v1/datasets?limit=3', {
			headers: { 'if-none-match': tag }
		});
		expect(again.status).toBe(304);
		await conforms('/datasets', 'get', again);
		const one = await script.fetch(`/api/v1/datasets/${fixture.open.dataset}`);
		expect(one.status).toBe(200);
		await conforms('/datasets/{id}', 'get', one);
		await conforms('/datasets/{id}', 'get', await script.fetch(`/api/v1/datasets/${unknownId}`));
	});

	it('sites, a site and its logs', async () => {
		for (const q of [
			'f=geojson&limit=5',
			'f=json&sort=code&order=desc&limit=5',
			'bbox=1,2,3',
			'limit=5000'
		])
			await conforms('/sites', 'get', await script.fetch(`/api/v1/sites?${q}`));
		// RFC 7946: the default answer is a FeatureCollection a GeoJSON reader accepts as it is.
		const geojson = await (await script.fetch('/api/v1/sites?limit=20')).json();
		expect(isFeatureCollection(geojson, true)).toEqual([]);
		expect(geojson.features.length).toBeGreaterThan(0);
		const feature = await (
			await script.fetch(`/api/v1/sites/${fixture.open.sites[0]}?f=geojson`)
		).json();
		expect(valid(feature, true)).toEqual([]);
		const site = fixture.open.sites[0];
		for (const f of ['json', 'geojson'])
			await conforms('/sites/{id}', 'get', await script.fetch(`/api/v1/sites/${site}?f=${f}`));
		await conforms(
			'/sites/{id}',
			'get',
			await anonymous.json(`/api/v1/sites/${fixture.hidden.sites[0]}`, undefined, 'GET')
		);
		const logs = await script.fetch(`/api/v1/sites/${site}/temperature-logs`);
		expect(logs.status).toBe(200);
		await conforms('/sites/{id}/temperature-logs', 'get', logs);
		await conforms(
			'/sites/{id}/temperature-logs',
			'get',
			await script.fetch(`/api/v1/sites/${unknownId}/temperature-logs`)
		);
		await conforms('/sites', 'get', await new KeyClient('thl_unknown').fetch('/api/v1/sites'));
	});

	it('computations', async () => {
		const model = {
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 65,
			heatFlowSigmaMWm2: 5,
			layers: [
				{ thicknessM: 15000, conductivityWmK: 3, heatProductionUWm3: 1, conductivitySigmaWmK: 0.3 },
				{ thicknessM: 20000, conductivityWmK: 2.5, heatProductionUWm3: 0.4 }
			],
			samples: 200,
			isothermsC: [150]
		};
		const geotherm = await script.fetch('/api/v1/compute/geotherm', {
			method: 'POST',
			body: model
		});
		expect(geotherm.status).toBe(200);
		await conforms('/compute/geotherm', 'post', geotherm);
		const bad = { ...model, basalHeatFlowMWm2: 30 };
		await conforms(
			'/compute/geotherm',
			'post',
			await script.fetch('/api/v1/compute/geotherm', { method: 'POST', body: bad })
		);
		const log = {
			depthM: [0, 100, 200],
			temperatureC: [10, 13, 16],
			conductivity: [{ topM: 0, bottomM: 200, conductivityWmK: 2.5 }],
			method: 'bullard'
		};
		await conforms(
			'/compute/heat-flow',
			'post',
			await script.fetch('/api/v1/compute/heat-flow', { method: 'POST', body: log })
		);
		// Conductivity that does not cover the log: refused by the thermal core, not by the schema.
		const short = { ...log, conductivity: [{ topM: 0, bottomM: 50, conductivityWmK: 2.5 }] };
		const refused = await script.fetch('/api/v1/compute/heat-flow', {
			method: 'POST',
			body: short
		});
		expect(refused.status).toBe(422);
		await conforms('/compute/heat-flow', 'post', refused);
		await conforms(
			'/compute/heat-flow',
			'post',
			await script.fetch('/api/v1/compute/heat-flow', {
				method: 'POST',
				body: 'x',
				headers: { 'content-type': 'application/xml' }
			})
		);
	});

	it('the document itself', async () => {
		await conforms(
			'/openapi.json',
			'get',
			await anonymous.json('/api/v1/openapi.json', undefined, 'GET')
		);
	});

	it('the map: sites in a box, views, counts, regions, search', async () => {
		const box = '140,70,141,71';
		const geojson = await script.fetch(`/api/v1/sites.geojson?bbox=${box}`);
		expect(geojson.status).toBe(200);
		await conforms('/sites.geojson', 'get', geojson);
		await conforms('/sites.geojson', 'get', await script.fetch('/api/v1/sites.geojson?bbox=1,2'));
		const cells = await script.fetch(`/api/v1/map?bbox=-180,-85,180,85&zoom=2`);
		expect(cells.status).toBe(200);
		const tag = cells.headers.get('etag')!;
		await conforms('/map', 'get', cells);
		const again = await script.fetch(`/api/v1/map?bbox=-180,-85,180,85&zoom=2`, {
			headers: { 'if-none-match': tag }
		});
		expect(again.status).toBe(304);
		await conforms('/map', 'get', again);
		const sites = await script.fetch(`/api/v1/map?bbox=${box}&zoom=10&method=bullard`);
		expect(sites.status).toBe(200);
		await conforms('/map', 'get', sites);
		await conforms('/map', 'get', await script.fetch(`/api/v1/map?bbox=${box}&zoom=x`));
		await conforms('/map', 'get', await script.fetch(`/api/v1/map?bbox=${box}&zoom=3&quality=Z`));
		await conforms('/map/count', 'get', await script.fetch('/api/v1/map/count?method=bullard'));
		await conforms('/map/region', 'get', await script.fetch(`/api/v1/map/region?bbox=${box}`));
		await conforms('/map/region', 'get', await script.fetch('/api/v1/map/region'));
		const search = await script.fetch('/api/v1/map/search?q=OGC-O');
		expect((await search.clone().json()).sites.length).toBeGreaterThan(0);
		await conforms('/map/search', 'get', search);
		await conforms('/map/search', 'get', await script.fetch('/api/v1/map/search?q='));
	});

	it('saved regions: save, list, read, rename, use, delete and refusals', async () => {
		const ring = [
			[140, 70],
			[141, 70],
			[141, 71],
			[140, 70]
		];
		const name = `Contract region ${Date.now().toString(36)}`;
		const body = { name, geometry: { type: 'Polygon', coordinates: [ring] } };
		const created = await writer.fetch('/api/v1/regions', { method: 'POST', body });
		expect(created.status).toBe(201);
		const { id } = await created.clone().json();
		await conforms('/regions', 'post', created);
		await conforms(
			'/regions',
			'post',
			await writer.fetch('/api/v1/regions', { method: 'POST', body })
		);
		await conforms(
			'/regions',
			'post',
			await writer.fetch('/api/v1/regions', { method: 'POST', body: { ...body, name: '' } })
		);
		await conforms(
			'/regions',
			'post',
			await script.fetch('/api/v1/regions', { method: 'POST', body })
		);
		await conforms('/regions', 'get', await script.fetch('/api/v1/regions'));
		await conforms('/regions', 'get', await anonymous.get('/api/v1/regions'));
		await conforms('/regions/{id}', 'get', await script.fetch(`/api/v1/regions/${id}`));
		await conforms('/regions/{id}', 'get', await script.fetch(`/api/v1/regions/${unknownId}`));
		await conforms(
			'/regions/{id}',
			'patch',
			await writer.fetch(`/api/v1/regions/${id}`, { method: 'PATCH', body: { name: `${name} b` } })
		);
		await conforms(
			'/regions/{id}',
			'patch',
			await writer.fetch(`/api/v1/regions/${id}`, { method: 'PATCH', body: {} })
		);
		await conforms('/map/region', 'get', await script.fetch(`/api/v1/map/region?region=${id}`));
		await conforms(
			'/map/region',
			'get',
			await script.fetch(`/api/v1/map/region?region=${unknownId}`)
		);
		await conforms(
			'/regions/{id}',
			'delete',
			await writer.fetch(`/api/v1/regions/${id}`, { method: 'DELETE' })
		);
		await conforms(
			'/regions/{id}',
			'delete',
			await writer.fetch(`/api/v1/regions/${id}`, { method: 'DELETE' })
		);
	});

	it('grids: request, status, files and refusals', async () => {
		const request = { method: 'idw', bbox: [8.4, 58.9, 10.2, 60.1], cellSizeM: 25_000 };
		const accepted = await writer.fetch('/api/v1/grids', { method: 'POST', body: request });
		expect(accepted.status).toBe(202);
		const { id } = await accepted.clone().json();
		await conforms('/grids', 'post', accepted);
		// A read-only key may not start jobs.
		const readOnly = await script.fetch('/api/v1/grids', { method: 'POST', body: request });
		expect(readOnly.status).toBe(403);
		await conforms('/grids', 'post', readOnly);
		await conforms(
			'/grids',
			'post',
			await writer.fetch('/api/v1/grids', {
				method: 'POST',
				body: { ...request, method: 'spline' }
			})
		);
		await conforms(
			'/grids',
			'post',
			await writer.fetch('/api/v1/grids', {
				method: 'POST',
				body: 'not json',
				headers: { 'content-type': 'application/json' }
			})
		);
		// Wait for the state a client waits for: the job's end. The grid queue is shared with the
		// other test files (grids.spec.ts queues a rate limit's worth of jobs), so under load this
		// job may wait behind theirs: the loop (up to 120 s), not vitest's default, bounds the wait.
		let status = await script.fetch(`/api/v1/grids/${id}`);
		for (let i = 0; i < 600; i++) {
			const body = await status.clone().json();
			if (body.status === 'done' || body.status === 'failed') break;
			await new Promise((r) => setTimeout(r, 200));
			status = await script.fetch(`/api/v1/grids/${id}`);
		}
		expect((await status.clone().json()).status).toBe('done');
		await conforms('/grids/{id}', 'get', status);
		await conforms('/grids/{id}', 'get', await script.fetch(`/api/v1/grids/${unknownId}`));
		for (const file of ['heat-flow.tif', 'grid.csv', 'contours.geojson', 'heat-flow.png']) {
			const res = await script.fetch(`/api/v1/grids/${id}/${file}`);
			expect(res.status, file).toBe(200);
			await conforms('/grids/{id}/{file}', 'get', res);
		}
		await conforms('/grids/{id}/{file}', 'get', await script.fetch(`/api/v1/grids/${id}/x.txt`));
	}, 180_000);

	it('files and imports, through the wizard’s calls', async () => {
		const datasetId = await createDraftDataset(contributor, `Contract ${Date.now()}`);
		// A place of its own, so other files' near-duplicate checks never meet these sites.
		const csv = new TextEncoder().encode(gridCsv(4, 'CONTRACT', { lon: 160, lat: -60 }));
		const announce = (body: unknown) => contributor.json('/api/v1/attachments', body);
		const announced = await announce({ datasetId, fileName: 'sites.csv', sizeBytes: csv.length });
		expect(announced.status).toBe(201);
		const { id: fileId, uploadUrl } = await announced.clone().json();
		await conforms('/attachments', 'post', announced);
		await conforms('/attachments', 'post', await announce({ datasetId, fileName: '' }));
		await conforms(
			'/attachments',
			'post',
			await anonymous.json('/api/v1/attachments', { datasetId, fileName: 'a', sizeBytes: 1 })
		);
		const put = await contributor.put(uploadUrl, csv);
		expect(put.status).toBe(200);
		await conforms('/attachments/{id}/content', 'put', put);
		// Once checked, a file cannot be replaced.
		await conforms('/attachments/{id}/content', 'put', await contributor.put(uploadUrl, csv));

		const start = (body: unknown) =>
			contributor.json(`/api/v1/datasets/${datasetId}/imports`, body);
		const started = await start({ attachmentId: fileId });
		expect(started.status).toBe(201);
		const table = await started.clone().json();
		await conforms('/datasets/{id}/imports', 'post', started);
		await conforms('/datasets/{id}/imports', 'post', await start({ attachmentId: 'x' }));
		await conforms(
			'/datasets/{id}/imports',
			'post',
			await contributor.json(`/api/v1/datasets/${unknownId}/imports`, { attachmentId: fileId })
		);

		const preview = await contributor.json(`/api/v1/imports/${table.batchId}/preview`, {
			mapping: table.suggested,
			epsg: 4326
		});
		expect(preview.status).toBe(200);
		const { revision } = await preview.clone().json();
		await conforms('/imports/{id}/preview', 'post', preview);
		await conforms(
			'/imports/{id}/preview',
			'post',
			await contributor.json(`/api/v1/imports/${table.batchId}/preview`, { mapping: 3 })
		);
		await conforms(
			'/imports/{id}/preview',
			'post',
			await contributor.json(`/api/v1/imports/${unknownId}/preview`, { mapping: {} })
		);
		const commit = await contributor.json(`/api/v1/imports/${table.batchId}/commit`, {
			revision
		});
		expect(commit.status).toBe(202);
		await conforms('/imports/{id}/commit', 'post', commit);
		await conforms(
			'/imports/{id}/commit',
			'post',
			await contributor.json(`/api/v1/imports/${table.batchId}/commit`, { revision: 0 })
		);
		const progress = await contributor.get(`/api/v1/imports/${table.batchId}`);
		expect(progress.status).toBe(200);
		await conforms('/imports/{id}', 'get', progress);
		await conforms('/imports/{id}', 'get', await anonymous.get(`/api/v1/imports/${table.batchId}`));

		// An image: its download and thumbnail, then deleting it.
		const png = await sharp({
			create: { width: 300, height: 200, channels: 3, background: '#2f6f4f' }
		})
			.png()
			.toBuffer();
		const image = await (
			await announce({ datasetId, fileName: 'core.png', sizeBytes: png.length })
		).json();
		expect((await contributor.put(image.uploadUrl, png)).status).toBe(200);
		for (const what of ['download', 'thumbnail'] as const) {
			const template = `/attachments/{id}/${what}`;
			const res = await contributor.get(`/api/v1/attachments/${image.id}/${what}`);
			expect(res.status, what).toBe(200);
			await conforms(template, 'get', res);
			await conforms(
				template,
				'head',
				await contributor.get(`/api/v1/attachments/${image.id}/${what}`, 'HEAD')
			);
			await conforms(
				template,
				'get',
				await anonymous.get(`/api/v1/attachments/${image.id}/${what}`)
			);
		}
		const del = () => contributor.json(`/api/v1/attachments/${image.id}`, undefined, 'DELETE');
		const deleted = await del();
		expect(deleted.status).toBe(204);
		await conforms('/attachments/{id}', 'delete', deleted);
		await conforms('/attachments/{id}', 'delete', await del());
	});
});

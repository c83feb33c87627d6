import fs from 'node:fs';
import path from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { isFeatureCollection, valid } from 'geojson-validation';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { temperatureLog } from '../../src/lib/server/db/schema';
import { KeyClient, keyFor } from './api-key-client';
import { testEnv } from './env';
import { Client } from './http';
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

/** Routes under /api/v1 older than the document; they keep their own `{ message }` error body. */
const UNDOCUMENTED = new Set([
	'/sites.geojson',
	'/attachments',
	'/attachments/{id}',
	'/attachments/{id}/content',
	'/attachments/{id}/download',
	'/attachments/{id}/thumbnail',
	'/datasets/{id}/imports',
	'/imports/{id}',
	'/imports/{id}/preview',
	'/imports/{id}/commit',
	// Grid jobs (README "Heat-flow grids"): not yet in the generated document.
	'/grids',
	'/grids/{id}',
	'/grids/{id}/{file}',
	'/grids/{id}/statistics',
	'/openapi.json',
	// The map's own routes (DEVELOPERS.md "The map at scale"): not in the generated document.
	'/map',
	'/map/count',
	'/map/search',
	'/map/region',
	'/map/region/sites.csv',
	'/map/region/sites.geojson'
]);

const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let doc: Doc;
let fixture: OgcFixture;
let script: KeyClient;
const anonymous = new Client();
const ajv = new Ajv2020({ strict: false, validateFormats: false, allErrors: true });

beforeAll(async () => {
	fixture = await createOgcFixture();
	script = new KeyClient((await keyFor(db, 'viewer@korvald-survey.example')).key);
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
	if (!documented.content) return expect(await res.text()).toBe('');
	expect(Object.keys(documented.content), `${template} ${status} ${type}`).toContain(type);
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

	it('names every route under /api/v1 (older routes listed as such)', () => {
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
		for (const route of found) if (!UNDOCUMENTED.has(route)) expect(documented).toContain(route);
		for (const route of documented) expect(found).toContain(route);
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
});

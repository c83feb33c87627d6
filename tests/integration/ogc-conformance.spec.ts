import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { ACROSS, BOX, OPEN_IN_BOX, createOgcFixture, ogcGet, type OgcFixture } from './ogc-fixture';
import { Client } from './http';

/*
 * Checks written from the abstract test suite of OGC API – Features, Part 1: Core (OGC 17-069r4,
 * Annex A) for the requirements classes this server declares: Core, GeoJSON and HTML. Each test
 * names the requirement(s) it covers. Callers are anonymous here; who sees what is in ogc.spec.ts.
 */

type Link = { href: string; rel: string; type: string };
type Json = Record<string, unknown> & { links: Link[] };

let fx: OgcFixture;
const anonymous = new Client();
const get = (path: string, headers?: Record<string, string>) => ogcGet(anonymous, path, headers);
const json = async (path: string) => {
	const res = await get(path);
	expect(res.status, path).toBe(200);
	return (await res.json()) as Json;
};
const linkOf = (doc: { links: Link[] }, rel: string, type?: string) =>
	doc.links.find((l) => l.rel === rel && (type === undefined || l.type === type));

beforeAll(async () => {
	fx = await createOgcFixture();
});
afterAll(async () => {
	await fx.close();
});

describe('OGC API – Features Core: landing page, API definition, conformance', () => {
	it('/req/core/root-op, /req/core/root-success: the landing page links to the API definition, conformance and collections', async () => {
		const res = await get('/ogc');
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/json');
		const doc = (await res.json()) as Json;
		expect(typeof doc.title).toBe('string');
		expect(linkOf(doc, 'self', 'application/json')).toBeDefined();
		expect(linkOf(doc, 'service-doc') ?? linkOf(doc, 'service-desc')).toBeDefined();
		expect(linkOf(doc, 'conformance')!.href).toMatch(/\/ogc\/conformance$/);
		expect(linkOf(doc, 'data')!.href).toMatch(/\/ogc\/collections$/);
	});

	it('/req/core/api-definition-op, /req/core/api-definition-success: the service-doc link answers in its media type', async () => {
		const doc = await json('/ogc');
		const link = linkOf(doc, 'service-doc')!;
		const res = await get(link.href, { accept: link.type });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toContain(link.type);
		expect(await res.text()).toContain('<table>');
	});

	it('/req/core/conformance-op, /req/core/conformance-success: conformsTo lists Core, GeoJSON and HTML and nothing unimplemented', async () => {
		const doc = await json('/ogc/conformance');
		expect(doc.conformsTo).toEqual([
			'http://www.opengis.net/spec/ogcapi-features-1/1.0/conf/core',
			'http://www.opengis.net/spec/ogcapi-features-1/1.0/conf/geojson',
			'http://www.opengis.net/spec/ogcapi-features-1/1.0/conf/html'
		]);
	});

	it('/req/core/http: HEAD answers like GET without a body', async () => {
		const res = await anonymous.get('/ogc/conformance?f=json', 'HEAD');
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/json');
		expect(await res.text()).toBe('');
	});
});

describe('OGC API – Features Core: collections', () => {
	it('/req/core/fc-md-op, /req/core/fc-md-success, /req/core/fc-md-links, /req/core/fc-md-items: every collection has an id, self and items links', async () => {
		const doc = await json('/ogc/collections');
		expect(linkOf(doc, 'self', 'application/json')).toBeDefined();
		const collections = doc.collections as Json[];
		const ids = collections.map((c) => c.id);
		expect(ids[0]).toBe('sites');
		expect(ids).toContain(`dataset-${fx.open.dataset}`);
		for (const c of collections) {
			expect(linkOf(c, 'items', 'application/geo+json')!.href).toMatch(
				new RegExp(`/ogc/collections/${c.id}/items$`)
			);
			expect(linkOf(c, 'self')).toBeDefined();
			for (const l of c.links) expect(l.type, `${c.id} ${l.rel}`).toBeTruthy();
		}
	});

	it('/req/core/fc-md-extent, /req/core/crs84: the extent holds every feature, in CRS84', async () => {
		const doc = await json(`/ogc/collections/dataset-${fx.open.dataset}`);
		const extent = doc.extent as {
			spatial: { bbox: number[][]; crs: string };
			temporal: { interval: (string | null)[][] };
		};
		expect(extent.spatial.crs).toBe('http://www.opengis.net/def/crs/OGC/1.3/CRS84');
		const [w, s, e, n] = extent.spatial.bbox[0];
		// The dataset has sites at 140–141 and at ±179.9: the one box that holds them all.
		expect([w, s, e, n]).toEqual([-179.9, 70.05, 179.9, expect.any(Number)]);
		expect(n).toBeLessThan(71);
		expect(extent.temporal.interval[0]).toEqual(['2000-01-01T00:00:00Z', '2010-12-31T23:59:59Z']);
	});

	it('/req/core/sfc-md-op, /req/core/sfc-md-success: one collection is the same object as in the list', async () => {
		const list = await json('/ogc/collections');
		const one = await json(`/ogc/collections/dataset-${fx.open.dataset}`);
		const listed = (list.collections as Json[]).find((c) => c.id === one.id)!;
		expect(one.title).toBe(listed.title);
		expect(one.extent).toEqual(listed.extent);
		expect(one.license).toBe('CC-BY-4.0');
		expect(linkOf(one, 'license')!.href).toBe('https://spdx.org/licenses/CC-BY-4.0.html');
		// The built citation (as on the dataset page and in downloads), not the free-text note.
		expect(one.citation).toMatch(
			new RegExp(
				`^Korvald.*\\(\\d{4}\\)\\. OGC open ${fx.run}, version 1 \\[data set\\]\\. .*Licence CC-BY-4\\.0\\. https?://\\S+/datasets/${fx.open.dataset}$`
			)
		);
		expect(listed.citation).toBe(one.citation);
	});

	it('404 for an unknown collection, a malformed id and a dataset that is not shared, with the same words', async () => {
		for (const id of [
			'dataset-00000000-0000-4000-8000-000000000000',
			'dataset-nope',
			'nothing',
			`dataset-${fx.hidden.dataset}`
		]) {
			const res = await get(`/ogc/collections/${id}`);
			expect(res.status, id).toBe(404);
			expect(await res.json()).toEqual({
				error: { code: 'not_found', message: NOT_FOUND_MESSAGE, details: {} }
			});
		}
	});
});

describe('OGC API – Features Core: features', () => {
	const items = (query: string) => `/ogc/collections/sites/items?${query}`;

	it('/req/core/fc-op, /req/core/fc-response, /req/geojson/definition, /req/geojson/content: a GeoJSON FeatureCollection of point features, lon/lat', async () => {
		const res = await get(items(`bbox=${BOX}`));
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/geo+json');
		const doc = await res.json();
		expect(doc.type).toBe('FeatureCollection');
		for (const f of doc.features) {
			expect(f.type).toBe('Feature');
			expect(f.geometry.type).toBe('Point');
			const [lon, lat] = f.geometry.coordinates;
			expect(lon).toBeGreaterThanOrEqual(140);
			expect(lat).toBeGreaterThanOrEqual(70);
			expect(typeof f.id).toBe('string');
		}
	});

	it('/req/core/fc-limit-definition, /req/core/fc-limit-response-1: no more features than limit; above the maximum the maximum is used', async () => {
		const five = await json(items(`bbox=${BOX}&limit=5`));
		expect((five.features as unknown[]).length).toBe(5);
		const big = await json(items(`bbox=${BOX}&limit=20000`));
		expect((big.features as unknown[]).length).toBe(OPEN_IN_BOX);
		const all = await json(items('limit=20000'));
		expect(all.numberReturned as number).toBeLessThanOrEqual(10_000);
		const next = linkOf(all, 'next');
		if (next) expect(new URL(next.href).searchParams.get('limit')).toBe('10000');
		const defaulted = await json(items(''));
		expect(defaulted.numberReturned as number).toBeLessThanOrEqual(100);
	});

	it('/req/core/query-param-invalid: limit below 1 or not a whole number is a 400 with the one error body', async () => {
		for (const limit of ['0', '-3', 'ten', '2.5']) {
			const res = await get(items(`limit=${limit}`));
			expect(res.status, limit).toBe(400);
			const body = await res.json();
			expect(body.error.code).toBe('invalid_parameter');
			expect(body.error.details).toEqual({ parameter: 'limit' });
			expect(body.error.message).toContain('limit');
		}
	});

	it('/req/core/fc-bbox-definition, /req/core/fc-bbox-response: only features in the box; a box across the antimeridian', async () => {
		const inBox = await json(items(`bbox=${BOX}&limit=1000`));
		const ids = (inBox.features as { id: string }[]).map((f) => f.id).sort();
		expect(ids).toEqual([...fx.open.sites].sort());
		const across = await json(items(`bbox=${ACROSS}`));
		expect((across.features as { id: string }[]).map((f) => f.id).sort()).toEqual(
			[...fx.open.across].sort()
		);
		// Six numbers (with heights) select the same horizontal box.
		const six = await json(items('bbox=140,70,-100,141,71,100&limit=1000'));
		expect(six.numberMatched).toBe(OPEN_IN_BOX);
	});

	it('/req/core/query-param-invalid: a bad bbox is a 400 whose message names the problem', async () => {
		const cases: [string, string][] = [
			['1,2,3', 'four numbers'],
			['1,2,east,4', 'not a number'],
			['10,5,20,1', 'south'],
			['190,0,200,1', 'west must be between'],
			['0,-91,1,1', 'south must be between'],
			['0,0,0,1,1,-1', 'height']
		];
		for (const [bbox, words] of cases) {
			const res = await get(items(`bbox=${bbox}`));
			expect(res.status, bbox).toBe(400);
			const body = await res.json();
			expect(body.error.message, bbox).toContain(words);
			expect(body.error.details.parameter).toBe('bbox');
		}
	});

	it('/req/core/fc-time-definition, /req/core/fc-time-response: datetime selects by measurement year; sites without a year match too', async () => {
		const expected = fx.open.sites.filter((id) => {
			const y = fx.years.get(id);
			return y === null || (y! >= 2003 && y! <= 2004);
		});
		for (const datetime of ['2003-06-01T00:00:00Z/2004-02-01T00:00:00Z', '2003-01-01/2004-12-31']) {
			const doc = await json(items(`bbox=${BOX}&limit=1000&datetime=${datetime}`));
			expect((doc.features as { id: string }[]).map((f) => f.id).sort(), datetime).toEqual(
				expected.sort()
			);
		}
		const open = await json(items(`bbox=${BOX}&limit=1000&datetime=../2001-12-31T00:00:00Z`));
		const openExpected = fx.open.sites.filter((id) => (fx.years.get(id) ?? 0) <= 2001);
		expect(open.numberMatched).toBe(openExpected.length);
		for (const bad of ['yesterday', '2004-01-01/2003-01-01', '../..', '2021-02-30']) {
			const res = await get(items(`datetime=${bad}`));
			expect(res.status, bad).toBe(400);
			expect((await res.json()).error.details.parameter).toBe('datetime');
		}
	});

	it('/req/core/query-param-unknown: an unknown query parameter is a 400', async () => {
		const res = await get(items('colour=red'));
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.error.code).toBe('unknown_parameter');
		expect(body.error.message).toContain('colour');
		expect((await get('/ogc/collections?limit=3')).status).toBe(400);
		// crs and bbox-crs are understood for CRS84, the one CRS served, and refused otherwise.
		const crs84 = encodeURIComponent('http://www.opengis.net/def/crs/OGC/1.3/CRS84');
		expect((await get(items(`bbox=${BOX}&bbox-crs=${crs84}&crs=${crs84}`))).status).toBe(200);
		const feature = `/ogc/collections/sites/items/${fx.open.sites[0]}`;
		expect((await get(`${feature}?crs=${crs84}`)).status).toBe(200);
		const refused = await get(`${feature}?crs=EPSG:3857`);
		expect(refused.status).toBe(400);
		expect((await refused.json()).error.details.parameter).toBe('crs');
		expect((await get(`${feature}?limit=3`)).status).toBe(400);
	});

	it('/req/core/fc-links, /req/core/fc-rel-type, /req/core/fc-numberMatched, /req/core/fc-numberReturned, /req/core/fc-timeStamp: following next covers every feature once; prev walks back', async () => {
		const before = Date.now();
		const pages: string[][] = [];
		let url: string | undefined = items(`bbox=${BOX}&limit=7`);
		let last: Json | undefined;
		while (url) {
			const doc = await json(url);
			expect(doc.numberMatched).toBe(OPEN_IN_BOX);
			const ids = (doc.features as { id: string }[]).map((f) => f.id);
			expect(doc.numberReturned).toBe(ids.length);
			const stamp = Date.parse(doc.timeStamp as string);
			expect(stamp).toBeGreaterThanOrEqual(before - 1000);
			expect(stamp).toBeLessThanOrEqual(Date.now() + 1000);
			expect(linkOf(doc, 'self', 'application/geo+json')).toBeDefined();
			expect(linkOf(doc, 'alternate', 'text/html')).toBeDefined();
			for (const l of doc.links) expect(l.rel && l.type).toBeTruthy();
			pages.push(ids);
			last = doc;
			url = linkOf(doc, 'next')?.href;
		}
		expect(pages.map((p) => p.length)).toEqual([7, 7, 7, 2]);
		const seen = pages.flat();
		expect(new Set(seen).size).toBe(seen.length);
		expect([...seen].sort()).toEqual([...fx.open.sites].sort());
		// Back from the last page with prev links: the same pages in reverse.
		const back: string[][] = [];
		url = linkOf(last!, 'prev')?.href;
		while (url) {
			const doc = await json(url);
			back.push((doc.features as { id: string }[]).map((f) => f.id));
			url = linkOf(doc, 'prev')?.href;
		}
		expect(back.reverse()).toEqual(pages.slice(0, -1));
	});

	it('/req/core/f-op, /req/core/f-success, /req/core/f-links: one feature with self, alternate and collection links', async () => {
		const id = fx.open.sites[0];
		const res = await get(`/ogc/collections/dataset-${fx.open.dataset}/items/${id}`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toBe('application/geo+json');
		const f = await res.json();
		expect(f.type).toBe('Feature');
		expect(f.id).toBe(id);
		expect(linkOf(f, 'self', 'application/geo+json')!.href).toMatch(new RegExp(`/items/${id}$`));
		expect(linkOf(f, 'alternate', 'text/html')).toBeDefined();
		expect(linkOf(f, 'collection', 'application/json')).toBeDefined();
		expect(f.properties).toMatchObject({
			code: `OGC-O-0-${fx.run}`,
			heatFlowMWm2: 50,
			licence: 'CC-BY-4.0',
			citation: `Invented citation for OGC open ${fx.run}`,
			datasetId: fx.open.dataset,
			yearMeasured: 2000
		});
	});

	it('404 for an unknown, malformed or hidden feature id, and for a feature of another collection', async () => {
		for (const path of [
			'/ogc/collections/sites/items/00000000-0000-4000-8000-000000000000',
			'/ogc/collections/sites/items/not-an-id',
			`/ogc/collections/sites/items/${fx.hidden.sites[0]}`,
			`/ogc/collections/dataset-${fx.hidden.dataset}/items`,
			`/ogc/collections/dataset-${fx.open.dataset}/items/${fx.draft.sites[0]}`
		]) {
			const res = await get(path);
			expect(res.status, path).toBe(404);
			expect((await res.json()).error.message).toBe(NOT_FOUND_MESSAGE);
		}
	});
});

describe('OGC API – Features HTML', () => {
	it('/req/html/definition, /req/html/content: every resource answers text/html to a browser and to f=html', async () => {
		const paths = [
			'/ogc',
			'/ogc/conformance',
			'/ogc/collections',
			'/ogc/collections/sites',
			`/ogc/collections/sites/items?bbox=${BOX}`,
			`/ogc/collections/sites/items/${fx.open.sites[0]}`
		];
		for (const path of paths) {
			const res = await anonymous.get(path); // a browser's Accept: text/html
			expect(res.status, path).toBe(200);
			expect(res.headers.get('content-type'), path).toBe('text/html; charset=utf-8');
			expect(await res.text()).toMatch(/^<!doctype html>[\s\S]*<h1>/);
			const asked = await get(`${path}${path.includes('?') ? '&' : '?'}f=html`);
			expect(asked.headers.get('content-type'), path).toBe('text/html; charset=utf-8');
		}
		const site = await (
			await anonymous.get(`/ogc/collections/sites/items/${fx.open.sites[0]}`)
		).text();
		expect(site).toContain(`OGC-O-0-${fx.run}`);
	});

	it('f other than json or html is a 400', async () => {
		const res = await get('/ogc?f=xml');
		expect(res.status).toBe(400);
		expect((await res.json()).error.details.parameter).toBe('f');
	});
});

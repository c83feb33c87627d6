import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { testEnv } from './env';
import {
	BOX,
	createOgcFixture,
	ogcClients,
	ogcGet,
	type Caller,
	type OgcFixture
} from './ogc-fixture';
import type { Client } from './http';

/*
 * /ogc through the one access layer: who sees which collections and features, ETags per
 * viewer, and read-only CORS. The standard's own checks are in ogc-conformance.spec.ts.
 */

let fx: OgcFixture;
let clients: Record<Caller, Client>;

beforeAll(async () => {
	fx = await createOgcFixture();
	clients = await ogcClients();
});
afterAll(async () => {
	await fx.close();
});

type Feature = { id: string };

/** Every feature of a collection in the fixture's box, following next links. */
async function allFeatures(k: Caller, collection = 'sites', limit = 4): Promise<string[]> {
	const ids: string[] = [];
	let url: string | undefined = `/ogc/collections/${collection}/items?bbox=${BOX}&limit=${limit}`;
	while (url) {
		const res = await ogcGet(clients[k], url);
		expect(res.status, url).toBe(200);
		const doc = await res.json();
		ids.push(...doc.features.map((f: Feature) => f.id));
		url = doc.links.find((l: { rel: string }) => l.rel === 'next')?.href;
	}
	return ids;
}

describe('who sees what through /ogc', () => {
	it('anonymous and outsiders page through public sites only; members also see their private and draft sites, each once', async () => {
		const open = [...fx.open.sites].sort();
		expect((await allFeatures('anonymous')).sort()).toEqual(open);
		expect((await allFeatures('outsider')).sort()).toEqual(open);
		const member = await allFeatures('member');
		expect(new Set(member).size).toBe(member.length);
		expect(member.sort()).toEqual([...open, ...fx.hidden.sites, ...fx.draft.sites].sort());
	});

	it('a private published dataset is a collection for its organisation only; a draft is no collection at all', async () => {
		const listed = async (k: Caller) =>
			((await (await ogcGet(clients[k], '/ogc/collections')).json()).collections as Feature[]).map(
				(c) => c.id
			);
		for (const k of ['anonymous', 'outsider'] as const) {
			expect(await listed(k)).not.toContain(`dataset-${fx.hidden.dataset}`);
			const res = await ogcGet(clients[k], `/ogc/collections/dataset-${fx.hidden.dataset}/items`);
			expect(res.status).toBe(404);
			expect((await res.json()).error.message).toBe(NOT_FOUND_MESSAGE);
		}
		expect(await listed('member')).toContain(`dataset-${fx.hidden.dataset}`);
		expect((await allFeatures('member', `dataset-${fx.hidden.dataset}`)).sort()).toEqual(
			[...fx.hidden.sites].sort()
		);
		for (const k of ['anonymous', 'member'] as const)
			expect(await listed(k)).not.toContain(`dataset-${fx.draft.dataset}`);
	});

	it('a hidden feature answers exactly like an unknown one to outsiders, and is there for members', async () => {
		const hidden = `/ogc/collections/sites/items/${fx.hidden.sites[0]}`;
		const unknown = '/ogc/collections/sites/items/00000000-0000-4000-8000-000000000000';
		for (const k of ['anonymous', 'outsider'] as const) {
			const [a, b] = await Promise.all([ogcGet(clients[k], hidden), ogcGet(clients[k], unknown)]);
			expect([a.status, b.status]).toEqual([404, 404]);
			expect(await a.text()).toBe(await b.text());
		}
		const res = await ogcGet(clients.member, hidden);
		expect(res.status).toBe(200);
		expect((await res.json()).properties.citation).toBe(
			`Invented citation for OGC hidden ${fx.run}`
		);
	});
});

describe('ETag and If-None-Match', () => {
	it('answers 304 without a body when the content is unchanged, though timeStamp moves on', async () => {
		const path = `/ogc/collections/sites/items?bbox=${BOX}&limit=5`;
		const first = await ogcGet(clients.anonymous, path);
		const etag = first.headers.get('etag')!;
		expect(etag).toMatch(/^W\/"/);
		const again = await ogcGet(clients.anonymous, path, { 'if-none-match': etag });
		expect(again.status).toBe(304);
		expect(await again.text()).toBe('');
		expect(again.headers.get('etag')).toBe(etag);
		const other = await ogcGet(clients.anonymous, path, { 'if-none-match': 'W/"other"' });
		expect(other.status).toBe(200);
		for (const p of ['/ogc', '/ogc/conformance', '/ogc/collections']) {
			const tag = (await ogcGet(clients.anonymous, p)).headers.get('etag')!;
			expect((await ogcGet(clients.anonymous, p, { 'if-none-match': tag })).status, p).toBe(304);
		}
	});

	it('a member and an anonymous caller get different tags for the same address, so neither revalidates the other’s copy', async () => {
		const path = `/ogc/collections/sites/items?bbox=${BOX}`;
		const anon = (await ogcGet(clients.anonymous, path)).headers.get('etag')!;
		const member = await ogcGet(clients.member, path, { 'if-none-match': anon });
		expect(member.status).toBe(200);
		expect(member.headers.get('etag')).not.toBe(anon);
		expect(member.headers.get('vary')).toContain('Cookie');
	});

	it('changed data changes the tag', async () => {
		const path = `/ogc/collections/sites/items/${fx.open.sites[1]}`;
		const tag = (await ogcGet(clients.anonymous, path)).headers.get('etag')!;
		const { createDb } = await import('../../src/lib/server/db/client');
		const { site } = await import('../../src/lib/server/db/schema');
		const { eq } = await import('drizzle-orm');
		const { db, client } = createDb(testEnv.databaseUrl(), { max: 1 });
		await db.update(site).set({ heatFlowMWm2: 99 }).where(eq(site.id, fx.open.sites[1]));
		await client.end();
		const res = await ogcGet(clients.anonymous, path, { 'if-none-match': tag });
		expect(res.status).toBe(200);
		expect((await res.json()).properties.heatFlowMWm2).toBe(99);
	});
});

describe('CORS: browser GIS clients may read, never with the visitor’s credentials', () => {
	const origin = 'https://gis.example';

	it('a preflight from another origin allows GET, HEAD and OPTIONS only', async () => {
		const res = await fetch(`${testEnv.appUrl()}/ogc/collections/sites/items`, {
			method: 'OPTIONS',
			headers: {
				origin,
				'access-control-request-method': 'GET',
				'access-control-request-headers': 'if-none-match'
			}
		});
		expect(res.status).toBe(204);
		expect(res.headers.get('access-control-allow-origin')).toBe('*');
		expect(res.headers.get('access-control-allow-methods')).toBe('GET, HEAD, OPTIONS');
		expect(res.headers.get('access-control-allow-headers')).toContain('If-None-Match');
		expect(res.headers.has('access-control-allow-credentials')).toBe(false);
	});

	it('answers, errors included, allow any origin to read but never with credentials', async () => {
		for (const path of ['/ogc', `/ogc/collections/sites/items?bbox=${BOX}`, '/ogc/collections/x']) {
			const res = await ogcGet(clients.member, path, { origin });
			expect(res.headers.get('access-control-allow-origin'), path).toBe('*');
			expect(res.headers.has('access-control-allow-credentials'), path).toBe(false);
			expect(res.headers.get('access-control-expose-headers'), path).toBe('ETag');
		}
	});

	it('nothing under /ogc accepts a write', async () => {
		for (const method of ['POST', 'PUT', 'DELETE']) {
			const res = await clients.member.json('/ogc/collections/sites/items', {}, method);
			expect(res.status, method).toBe(405);
		}
	});
});

import { and, eq, inArray, sql as dsql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NOT_FOUND_MESSAGE } from '../../src/lib/server/access/not-found';
import { createDb } from '../../src/lib/server/db/client';
import {
	auditEvent,
	dataset,
	savedRegion,
	site,
	user,
	type NewDataset
} from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * Saved regions (/api/v1/regions and `region=<id>` of the region statistics and downloads), on
 * invented sites of a box of the Southern Ocean of their own (lon 140…145, lat -50…-45), all in one
 * public dataset: heat flow 40 at (141, -49), 60 at (142, -48.7), 80 at (144, -46). The triangle
 * saved below, (140.5 -49.5, 143 -49.5, 140.5 -47), is x ≥ 140.5, y ≥ -49.5, x + y ≤ 93.5: it
 * holds the first two (x + y = 92 and 93.3), not the third (outside its box).
 * Korvald's curator saves; Korvald's contributor is a fellow member; Lindmark's owner is an
 * outsider.
 */

const run = Date.now().toString(36);
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const codes = `q=SR${run}`;
let curator: Client;
let fellow: Client;
let outsider: Client;
const anonymous = new Client();
let curatorId: string;

/** Triangle corners (closed ring) and a rectangle as a polygon. */
const triangle = [
	[140.5, -49.5],
	[143, -49.5],
	[140.5, -47],
	[140.5, -49.5]
];
/** Its last side crosses its first: PostGIS names the crossing. */
const bowtie = [
	[140, -50],
	[145, -45],
	[145, -48],
	[141, -45],
	[140, -50]
];
const polygon = (ring: number[][]) => ({ type: 'Polygon', coordinates: [ring] });

beforeAll(async () => {
	[curator, fellow, outsider] = await Promise.all([
		signIn('curator@korvald-survey.example', DEMO_PASSWORD),
		signIn('contributor@korvald-survey.example', DEMO_PASSWORD),
		signIn('owner@lindmark-thermics.example', DEMO_PASSWORD)
	]);
	[{ id: curatorId }] = await db
		.select({ id: user.id })
		.from(user)
		.where(eq(user.email, 'curator@korvald-survey.example'));
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: 'org-korvald-survey',
			title: `Saved regions ${run}`,
			licence: 'CC-BY-4.0',
			status: 'published',
			visibility: 'public'
		} as NewDataset)
		.returning({ id: dataset.id });
	await db.insert(site).values([
		{ datasetId: d.id, code: `SR${run}-1`, location: { lon: 141, lat: -49 }, heatFlowMWm2: 40 },
		{ datasetId: d.id, code: `SR${run}-2`, location: { lon: 142, lat: -48.7 }, heatFlowMWm2: 60 },
		{ datasetId: d.id, code: `SR${run}-3`, location: { lon: 144, lat: -46 }, heatFlowMWm2: 80 }
	]);
});

afterAll(async () => {
	await sql.end();
});

const save = (client: Client, body: unknown) => client.json('/api/v1/regions', body);
const curatorRegionCount = async () =>
	(
		await db
			.select({ n: dsql<number>`count(*)::int` })
			.from(savedRegion)
			.where(eq(savedRegion.ownerId, curatorId))
	)[0].n;

async function expectNotFound(res: Response) {
	expect(res.status).toBe(404);
	const body = await res.json();
	expect(body.error.code).toBe('not_found');
	expect(body.error.message).toBe(NOT_FOUND_MESSAGE);
}

describe('saved regions', () => {
	it('saves, lists, answers statistics and downloads by id, renames and deletes (audited)', async () => {
		const res = await save(curator, { name: `  Licence A ${run} `, geometry: polygon(triangle) });
		expect(res.status).toBe(201);
		const saved = await res.json();
		expect(res.headers.get('location')).toBe(`/api/v1/regions/${saved.id}`);
		expect(saved).toMatchObject({
			name: `Licence A ${run}`,
			mine: true,
			organisation: null,
			bbox: [140.5, -49.5, 143, -47],
			geometry: { type: 'Polygon', coordinates: [triangle] }
		});

		const list = await (await curator.get('/api/v1/regions')).json();
		expect(list.items.map((r: { id: string }) => r.id)).toContain(saved.id);
		expect((await (await curator.get(`/api/v1/regions/${saved.id}`)).json()).name).toBe(
			`Licence A ${run}`
		);

		// Hand-computed: the 40 and the 60 are inside (header), mean 50.
		const byId = await (await curator.get(`/api/v1/map/region?region=${saved.id}&${codes}`)).json();
		expect(byId).toMatchObject({ count: 2, withValue: 2, meanMWm2: 50, minMWm2: 40, maxMWm2: 60 });
		const csv = await (
			await curator.get(`/api/v1/map/region/sites.csv?region=${saved.id}&${codes}`)
		).text();
		expect(csv).toContain(`SR${run}-1,`);
		expect(csv).toContain(`SR${run}-2,`);
		expect(csv).not.toContain(`SR${run}-3,`);
		const geo = await (
			await curator.get(`/api/v1/map/region/sites.geojson?region=${saved.id}&${codes}`)
		).json();
		expect(geo.features).toHaveLength(2);

		const renamed = await curator.json(
			`/api/v1/regions/${saved.id}`,
			{ name: `Block 7 ${run}` },
			'PATCH'
		);
		expect(renamed.status).toBe(200);
		expect((await renamed.json()).name).toBe(`Block 7 ${run}`);

		const gone = await curator.json(`/api/v1/regions/${saved.id}`, undefined, 'DELETE');
		expect(gone.status).toBe(204);
		await expectNotFound(await curator.get(`/api/v1/regions/${saved.id}`));

		const audit = await db
			.select({ action: auditEvent.action, details: auditEvent.details })
			.from(auditEvent)
			.where(
				and(
					inArray(auditEvent.action, ['region.save', 'region.delete']),
					dsql`${auditEvent.details}->>'regionId' = ${saved.id}`
				)
			);
		expect(audit.map((a) => a.action).sort()).toEqual(['region.delete', 'region.save']);
		expect(audit.find((a) => a.action === 'region.delete')?.details).toMatchObject({
			name: `Block 7 ${run}`
		});
	});

	it('another user can neither read, use, rename nor delete my region: the one 404', async () => {
		const saved = await (
			await save(curator, { name: `Private ${run}`, geometry: polygon(triangle) })
		).json();
		await expectNotFound(await outsider.get(`/api/v1/regions/${saved.id}`));
		await expectNotFound(
			await outsider.json(`/api/v1/regions/${saved.id}`, { name: 'Mine now' }, 'PATCH')
		);
		await expectNotFound(await outsider.json(`/api/v1/regions/${saved.id}`, undefined, 'DELETE'));
		await expectNotFound(await outsider.get(`/api/v1/map/region?region=${saved.id}`));
		await expectNotFound(await outsider.get(`/api/v1/map/region/sites.csv?region=${saved.id}`));
		const list = await (await outsider.get('/api/v1/regions')).json();
		expect(list.items.map((r: { id: string }) => r.id)).not.toContain(saved.id);
		// A fellow member does not see an unshared region either.
		await expectNotFound(await fellow.get(`/api/v1/regions/${saved.id}`));
		// Still there, unchanged.
		expect((await (await curator.get(`/api/v1/regions/${saved.id}`)).json()).name).toBe(
			`Private ${run}`
		);
		// Anonymous callers have no regions.
		expect((await anonymous.get('/api/v1/regions')).status).toBe(401);
		expect((await save(anonymous, { name: 'x', geometry: polygon(triangle) })).status).toBe(401);
		expect((await anonymous.get(`/api/v1/map/region?region=${saved.id}`)).status).toBe(401);
	});

	it('refuses bad names, bad outlines and a name already used, with a message, saving nothing', async () => {
		const before = await curatorRegionCount();
		const refusal = async (body: unknown, status: number, message: RegExp) => {
			const res = await save(curator, body);
			expect(res.status).toBe(status);
			expect((await res.json()).error.message).toMatch(message);
		};
		await refusal({ name: '   ', geometry: polygon(triangle) }, 400, /Give the region a name\./);
		await refusal({ name: 'x'.repeat(81), geometry: polygon(triangle) }, 400, /at most 80/);
		await refusal({ name: 'a\u0007b', geometry: polygon(triangle) }, 400, /control characters/);
		await refusal({ name: `Bowtie ${run}`, geometry: polygon(bowtie) }, 400, /Self-intersection/);
		await refusal(
			{ name: `Line ${run}`, geometry: polygon(triangle.slice(0, 2)) },
			400,
			/three corners/
		);
		await refusal({ name: `Sharing ${run}`, geometry: polygon(triangle), extra: 1 }, 400, /extra/);
		await refusal(
			{
				name: `Lindmark ${run}`,
				geometry: polygon(triangle),
				organisationId: 'org-lindmark-thermics'
			},
			403,
			/organisation you belong to/
		);
		const first = await save(curator, { name: `Twice ${run}`, geometry: polygon(triangle) });
		expect(first.status).toBe(201);
		await refusal(
			{ name: ` twice ${run.toUpperCase()}`, geometry: polygon(triangle) },
			409,
			/already have a region named/
		);
		const other = await (
			await save(curator, { name: `Other ${run}`, geometry: polygon(triangle) })
		).json();
		const clash = await curator.json(
			`/api/v1/regions/${other.id}`,
			{ name: `Twice ${run}` },
			'PATCH'
		);
		expect(clash.status).toBe(409);
		// The same name is free for somebody else.
		expect(
			(await save(outsider, { name: `Twice ${run}`, geometry: polygon(triangle) })).status
		).toBe(201);
		expect(await curatorRegionCount()).toBe(before + 2);
		const notJson = await curator.json('/api/v1/regions', undefined, 'POST', {
			'content-type': 'text/plain'
		});
		expect(notJson.status).toBe(415);
		const both = await curator.get(`/api/v1/map/region?region=${other.id}&bbox=140,-50,145,-45`);
		expect(both.status).toBe(400);
	});

	it("shares a region with the owner's organisation: members pick it, only the owner changes it", async () => {
		const saved = await (
			await save(curator, { name: `Licence area ${run}`, geometry: polygon(triangle) })
		).json();
		const shared = await curator.json(
			`/api/v1/regions/${saved.id}`,
			{ organisationId: 'org-korvald-survey' },
			'PATCH'
		);
		expect(shared.status).toBe(200);
		// The list offers the organisations one belongs to, and only those.
		const offered = async (c: Client) =>
			(await (await c.get('/api/v1/regions')).json()).shareWith.map((o: { id: string }) => o.id);
		expect(await offered(curator)).toEqual(['org-korvald-survey']);
		expect(await offered(outsider)).toEqual(['org-lindmark-thermics']);
		const seen = await (await fellow.get(`/api/v1/regions/${saved.id}`)).json();
		expect(seen).toMatchObject({ mine: false, organisation: { id: 'org-korvald-survey' } });
		const stats = await (await fellow.get(`/api/v1/map/region?region=${saved.id}&${codes}`)).json();
		expect(stats.count).toBe(2);
		const rename = await fellow.json(`/api/v1/regions/${saved.id}`, { name: 'Taken' }, 'PATCH');
		expect(rename.status).toBe(403);
		expect((await fellow.json(`/api/v1/regions/${saved.id}`, undefined, 'DELETE')).status).toBe(
			403
		);
		await expectNotFound(await outsider.get(`/api/v1/regions/${saved.id}`));
		// Unshared again: the fellow member loses it.
		await curator.json(`/api/v1/regions/${saved.id}`, { organisationId: null }, 'PATCH');
		await expectNotFound(await fellow.get(`/api/v1/regions/${saved.id}`));
	});
});

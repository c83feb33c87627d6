import { and, eq, inArray, sql as dsql } from 'drizzle-orm';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { auditEvent, dataset, site, type NewDataset } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * Map regions: downloads with citations, polygons and the import-flag filter, on invented data in
 * a box of the South Atlantic of its own (lon -20…-15, lat -40…-35):
 * - `pub` (Korvald, published public): four sites, heat flow 50, 60, 70, 80, at x = -19.5…-18.0;
 *   the 60 carries the flag `near-existing-site`, the 80 `heat-flow-implausible`;
 *   the 50 is named `=1+2` (a formula a spreadsheet would run);
 * - `lind` (Lindmark, published public): one site, heat flow 90;
 * - `priv` (private) and `emb` (embargoed to 2999), Korvald: one site each at the place of the
 *   public 60, heat flow 500, flagged `near-existing-site`.
 * Anonymous visitors and Lindmark's owner must never get the 500s; Korvald members must.
 */

const run = Date.now().toString(36);
const BOX = '-20,-40,-15,-35';
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const datasets: Record<'pub' | 'lind' | 'priv' | 'emb', string> = {} as never;
let anonymous: Client;
let outsider: Client;
let member: Client;
const mine = `q=MR${run}`;
const x = (i: number) => -19.5 + i * 0.5;

beforeAll(async () => {
	const make = async (key: keyof typeof datasets, org: string, state: Partial<NewDataset>) => {
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: org,
				title: `Map region ${key} ${run}`,
				authors: `Author ${key}`,
				licence: key === 'lind' ? 'CC0-1.0' : 'CC-BY-4.0',
				...state
			} as NewDataset)
			.returning({ id: dataset.id });
		datasets[key] = d.id;
	};
	await make('pub', 'org-korvald-survey', { status: 'published', visibility: 'public' });
	await make('lind', 'org-lindmark-thermics', { status: 'published', visibility: 'public' });
	await make('priv', 'org-korvald-survey', { status: 'published', visibility: 'private' });
	await make('emb', 'org-korvald-survey', {
		status: 'published',
		visibility: 'embargoed',
		embargoUntil: '2999-01-01'
	});
	const flags: string[][] = [[], ['near-existing-site'], [], ['heat-flow-implausible']];
	await db.insert(site).values([
		...[50, 60, 70, 80].map((hf, i) => ({
			datasetId: datasets.pub,
			code: `MR${run}-P${i}`,
			name: i === 0 ? '=1+2' : `Region well ${i}`,
			location: { lon: x(i), lat: -37 },
			heatFlowMWm2: hf,
			flags: flags[i] as never
		})),
		{
			datasetId: datasets.lind,
			code: `MR${run}-L0`,
			name: 'Lindmark well',
			location: { lon: x(0), lat: -36 },
			heatFlowMWm2: 90
		},
		...(['priv', 'emb'] as const).map((key) => ({
			datasetId: datasets[key],
			code: `MR${run}-${key}`,
			name: 'Secret well',
			location: { lon: x(1), lat: -37 },
			heatFlowMWm2: 500,
			flags: ['near-existing-site'] as never
		}))
	]);
	anonymous = new Client();
	outsider = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
	member = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
});

afterAll(async () => {
	await db.delete(dataset).where(inArray(dataset.id, Object.values(datasets)));
	await sql.end();
});

async function text(client: Client, path: string) {
	const res = await client.get(path);
	expect(res.status, await res.clone().text()).toBe(200);
	return { body: await res.text(), headers: res.headers };
}

function readCsv(csv: string) {
	const comments = csv.split('\n').filter((l) => l.startsWith('#'));
	const rows = Papa.parse<Record<string, string>>(csv, {
		comments: '#',
		header: true,
		skipEmptyLines: true
	}).data;
	return { comments, rows };
}

describe('region download as CSV', () => {
	it('holds the visible sites with one citation block per dataset', async () => {
		const { body, headers } = await text(
			anonymous,
			`/api/v1/map/region/sites.csv?bbox=${BOX}&${mine}`
		);
		expect(headers.get('content-type')).toMatch(/^text\/csv/);
		expect(headers.get('cache-control')).toContain('no-store');
		const { comments, rows } = readCsv(body);
		expect(rows).toHaveLength(5);
		expect(body).not.toContain('Secret well');
		expect(body).not.toMatch(/-(priv|emb)/);
		// One block per dataset: Korvald's and Lindmark's, each with its citation and licence.
		expect(comments.filter((c) => c.startsWith('# Cite as: '))).toHaveLength(2);
		expect(comments.some((c) => c.includes('Author pub') && c.includes('Licence CC-BY-4.0'))).toBe(
			true
		);
		expect(comments).toContain('# Licence (SPDX): CC0-1.0');
		expect(comments.some((c) => c.includes(`${datasets.pub} (4 sites)`))).toBe(true);
		expect(comments.some((c) => c.includes(`${datasets.lind} (1 site)`))).toBe(true);
		// Every row names its dataset, and only cited datasets appear.
		const ids = new Set(rows.map((r) => r.dataset_id));
		expect(ids).toEqual(new Set([datasets.pub, datasets.lind]));
		// Through the one CSV writer: a formula cell is neutralised.
		expect(body).toContain("'=1+2");
		expect(body).not.toMatch(/,=1\+2/);
	});

	it('gives members their hidden sites and datasets too, never others', async () => {
		const of = async (c: Client) =>
			readCsv((await text(c, `/api/v1/map/region/sites.csv?bbox=${BOX}&${mine}`)).body);
		expect((await of(outsider)).rows).toHaveLength(5);
		const seen = await of(member);
		expect(seen.rows).toHaveLength(7);
		expect(seen.comments.filter((c) => c.startsWith('# Cite as: '))).toHaveLength(4);
	});

	it('honours the map filters', async () => {
		const rows = async (filter: string) =>
			readCsv(
				(await text(anonymous, `/api/v1/map/region/sites.csv?bbox=${BOX}&${mine}&${filter}`)).body
			).rows;
		expect(await rows('minHeatFlow=65')).toHaveLength(3); // 70, 80, 90
		expect(await rows(`dataset=${datasets.lind}`)).toHaveLength(1);
		expect(await rows('flag=near-existing-site')).toHaveLength(1);
		// No site matches: the file says so and cites nothing.
		const none = readCsv(
			(
				await text(
					anonymous,
					`/api/v1/map/region/sites.csv?bbox=${BOX}&${mine}&method=marine_probe`
				)
			).body
		);
		expect(none.rows).toHaveLength(0);
		expect(none.comments.filter((c) => c.startsWith('# Cite as: '))).toHaveLength(0);
	});

	it('is logged as a download, one audit row per dataset', async () => {
		const filter = `minHeatFlow=55&${mine}`;
		await text(outsider, `/api/v1/map/region/sites.csv?bbox=${BOX}&${filter}`);
		const rows = await db
			.select({
				datasetId: auditEvent.datasetId,
				organisationId: auditEvent.organisationId,
				details: auditEvent.details
			})
			.from(auditEvent)
			.where(
				and(
					eq(auditEvent.action, 'download'),
					inArray(auditEvent.datasetId, Object.values(datasets)),
					dsql`${auditEvent.details}->>'filters' = ${`minHeatFlow=55&q=MR${run}`}`
				)
			);
		expect(rows.map((r) => r.datasetId).sort()).toEqual([datasets.pub, datasets.lind].sort());
		const pub = rows.find((r) => r.datasetId === datasets.pub)!;
		expect(pub.organisationId).toBe('org-korvald-survey');
		expect(pub.details).toMatchObject({ format: 'csv', sites: 3, region: `bbox=${BOX}` });
	});
});

describe('region download as GeoJSON', () => {
	it('carries metadata.datasets[] with citations, and only visible features', async () => {
		const { body, headers } = await text(
			anonymous,
			`/api/v1/map/region/sites.geojson?bbox=${BOX}&${mine}`
		);
		expect(headers.get('content-type')).toMatch(/^application\/geo\+json/);
		const doc = JSON.parse(body);
		expect(doc.type).toBe('FeatureCollection');
		expect(doc.features).toHaveLength(5);
		expect(doc.metadata.datasets.map((d: { id: string }) => d.id).sort()).toEqual(
			[datasets.pub, datasets.lind].sort()
		);
		for (const d of doc.metadata.datasets) {
			expect(d.citation).toContain(`Map region`);
			expect(d.licence).toMatch(/^CC/);
		}
		expect(
			doc.features.every((f: { properties: Record<string, unknown> }) =>
				[datasets.pub, datasets.lind].includes(f.properties.dataset_id as string)
			)
		).toBe(true);
	});
});

describe('polygon regions', () => {
	// A triangle around the public 50 and 60 (x -19.5, -19.0 at lat -37) and not the others.
	const triangle = [
		[-19.8, -37.5],
		[-18.7, -37.5],
		[-19.25, -36.5]
	];
	const param = encodeURIComponent(triangle.map((p) => p.join(' ')).join(','));

	it('downloads only the sites inside the polygon', async () => {
		const { rows } = readCsv(
			(await text(anonymous, `/api/v1/map/region/sites.csv?polygon=${param}&${mine}`)).body
		);
		expect(rows).toHaveLength(2);
		const member2 = readCsv(
			(await text(member, `/api/v1/map/region/sites.csv?polygon=${param}&${mine}`)).body
		);
		expect(member2.rows).toHaveLength(4);
	});

	it('statistics by POST (GeoJSON body) equal those of the GET link', async () => {
		const body = { type: 'Polygon', coordinates: [[...triangle, triangle[0]]] };
		const res = await anonymous.json(`/api/v1/map/region?${mine}`, body);
		expect(res.status, await res.clone().text()).toBe(200);
		const posted = await res.json();
		expect(posted.count).toBe(2);
		expect(posted.meanMWm2).toBeCloseTo(55, 10);
		const got = JSON.parse(
			(await text(anonymous, `/api/v1/map/region?polygon=${param}&${mine}`)).body
		);
		expect(got).toEqual(posted);
		// Members also count the hidden 500s inside.
		const seen = await (await member.json(`/api/v1/map/region?${mine}`, body)).json();
		expect(seen.count).toBe(4);
	});

	const bad: [string, unknown, string][] = [
		['not a polygon', { type: 'Point', coordinates: [0, 0] }, 'GeoJSON Polygon'],
		[
			'a hole',
			{
				type: 'Polygon',
				coordinates: [
					[
						[0, 0],
						[1, 0],
						[0, 1],
						[0, 0]
					],
					[
						[0.1, 0.1],
						[0.2, 0.1],
						[0.1, 0.2],
						[0.1, 0.1]
					]
				]
			},
			'no holes'
		],
		[
			'too many corners',
			{
				type: 'Polygon',
				coordinates: [
					Array.from({ length: 300 }, (_, i) => [
						Math.cos((2 * Math.PI * i) / 300),
						Math.sin((2 * Math.PI * i) / 300)
					])
				]
			},
			'at most 200 corners'
		],
		[
			'crossing itself',
			{
				type: 'Polygon',
				coordinates: [
					[
						[0, 0],
						[2, 2],
						[2, 0],
						[0, 1],
						[0, 0]
					]
				]
			},
			'not valid'
		],
		[
			'a latitude beyond 90',
			{
				type: 'Polygon',
				coordinates: [
					[
						[0, 0],
						[1, 95],
						[1, 0]
					]
				]
			},
			'latitude above 90'
		]
	];
	for (const [what, body, message] of bad) {
		it(`refuses ${what} with 400 and a message`, async () => {
			const res = await anonymous.json('/api/v1/map/region', body);
			expect(res.status).toBe(400);
			expect((await res.json()).error.message).toContain(message);
		});
	}

	it('refuses bbox and polygon together, and a malformed corner', async () => {
		for (const [path, message] of [
			[`/api/v1/map/region/sites.csv?bbox=${BOX}&polygon=${param}`, 'not both'],
			[`/api/v1/map/region/sites.geojson?polygon=1%202,3`, 'is not "lon lat"'],
			['/api/v1/map/region/sites.csv', 'bbox is required'],
			[`/api/v1/map/region/sites.csv?bbox=${BOX}&flag=bogus`, 'unknown flag']
		]) {
			const res = await fetch(testEnv.appUrl() + path);
			expect(res.status).toBe(400);
			expect((await res.json()).error.message).toContain(message);
		}
	});
});

describe('the import-flag filter', () => {
	it('matches sites carrying any chosen flag, at every zoom and in the count', async () => {
		for (const [filter, open, seen] of [
			['flag=near-existing-site', 1, 3],
			['flag=near-existing-site,heat-flow-implausible', 2, 4],
			['flag=heat-flow-negative', 0, 0]
		] as const) {
			for (const [client, expected] of [
				[anonymous, open],
				[member, seen]
			] as const) {
				for (const zoom of [3, 12]) {
					const res = await client.get(`/api/v1/map?bbox=${BOX}&zoom=${zoom}&${mine}&${filter}`);
					expect(res.status).toBe(200);
					expect((await res.json()).count, `${filter} zoom ${zoom}`).toBe(expected);
				}
				const count = await (await client.get(`/api/v1/map/count?${mine}&${filter}`)).json();
				expect(count.count).toBe(expected);
			}
		}
	});
});

describe('pre-built map cells', () => {
	const view = async (c: Client, zoom: number) => {
		const res = await c.get(
			`/api/v1/map?bbox=${BOX}&zoom=${zoom}&dataset=${Object.values(datasets).join(',')}`
		);
		expect(res.status).toBe(200);
		return res.json();
	};
	const counted = async (c: Client) =>
		(await (await c.get(`/api/v1/map/count?dataset=${Object.values(datasets).join(',')}`)).json())
			.count;
	const answers = async () => ({
		anonymous: [await view(anonymous, 3), await view(anonymous, 5), await counted(anonymous)],
		outsider: [await view(outsider, 3), await view(outsider, 5), await counted(outsider)],
		member: [await view(member, 3), await view(member, 5), await counted(member)]
	});

	it('answer as the sites do, before and after the rebuild, hidden datasets never counted', async () => {
		const before = await answers();
		expect(before.anonymous[0].count).toBe(5);
		expect(before.anonymous[0].cells[0].maxMWm2).toBe(90);
		expect(before.member[0].count).toBe(7);
		expect(before.member[0].cells[0].maxMWm2).toBe(500);
		expect(before.anonymous[2]).toBe(5);
		expect(before.member[2]).toBe(7);
		for (const id of Object.values(datasets)) await sql`SELECT map_cell_refresh(${id}::uuid)`;
		const built = await sql`SELECT count(*)::int AS n FROM map_cell
			WHERE dataset_id = ${datasets.priv}::uuid AND zoom = 3`;
		expect(built[0].n).toBe(1);
		const stale = await sql`SELECT count(*)::int AS n FROM map_cell_stale
			WHERE dataset_id IN ${sql(Object.values(datasets))}`;
		expect(stale[0].n).toBe(0);
		expect(await answers()).toEqual(before);
		expect(before.outsider).toEqual(before.anonymous);
	});

	it('a change to the sites counts at once (the dataset is answered from its sites)', async () => {
		await db.insert(site).values({
			datasetId: datasets.pub,
			code: `MR${run}-NEW`,
			name: 'New well',
			location: { lon: x(2), lat: -36.5 },
			heatFlowMWm2: 1000
		});
		try {
			const after = await view(anonymous, 3);
			expect(after.count).toBe(6);
			expect(after.cells[0].maxMWm2).toBe(1000);
		} finally {
			await db.delete(site).where(eq(site.code, `MR${run}-NEW`));
		}
		expect((await view(anonymous, 3)).count).toBe(5);
	});
});

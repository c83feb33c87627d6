import { inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, site, temperatureLog, type NewDataset } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * The map at scale (/api/v1/map and its count, search and region routes) on invented data in a
 * box of the central Pacific of its own (lon -150…-145, lat 10…15):
 * - `pub`: Korvald, published public, six sites (five with heat flow 50, 60, 70, 80, 100; one without);
 * - `lind`: Lindmark, published public, two sites (heat flow 90);
 * - `priv` (private) and `emb` (embargoed to 2999), Korvald: one site at each public site's place
 *   with heat flow 500, and two more at a place where no public site is (HIDDEN_ONLY).
 * Anonymous visitors and Lindmark's owner must never count, see or find the 500s; Korvald members
 * must.
 */

const run = Date.now().toString(36);
const BOX = '-150,10,-145,15';
const PUBLIC_VALUES = [50, 60, 70, 80, 100, null];
const HIDDEN_ONLY = { lon: -146, lat: 14 };
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const datasets: Record<'pub' | 'lind' | 'priv' | 'emb', string> = {} as never;
let anonymous: Client;
let outsider: Client;
let member: Client;

const place = (i: number) => ({ lon: -149.9 + i * 0.1, lat: 10.2 + i * 0.05 });

beforeAll(async () => {
	const make = async (key: keyof typeof datasets, org: string, state: Partial<NewDataset>) => {
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: org,
				title: `Map scale ${key} ${run}`,
				licence: 'CC-BY-4.0',
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
	const qualities = ['well-constrained', 'constrained', 'constrained', 'indicative', null, null];
	const rows = PUBLIC_VALUES.map((hf, i) => ({
		datasetId: datasets.pub,
		code: `MS${run}-P${i}`,
		name: `Scale well ${i}`,
		location: place(i),
		heatFlowMWm2: hf,
		yearMeasured: 1970 + i * 10,
		qualityClass: qualities[i] as 'constrained' | null
	}));
	rows.push(
		...[0, 1].map((i) => ({
			datasetId: datasets.lind,
			code: `MS${run}-L${i}`,
			name: null as unknown as string,
			location: place(i),
			heatFlowMWm2: 90,
			yearMeasured: 2000,
			qualityClass: null
		}))
	);
	for (const key of ['priv', 'emb'] as const) {
		[...PUBLIC_VALUES.map((_, i) => place(i)), HIDDEN_ONLY, HIDDEN_ONLY].forEach((location, i) =>
			rows.push({
				datasetId: datasets[key],
				code: `MS${run}-${key}${i}`,
				name: `Secret well ${i}`,
				location,
				heatFlowMWm2: 500,
				yearMeasured: 1990,
				qualityClass: 'constrained'
			})
		);
	}
	const inserted = await db.insert(site).values(rows).returning({ id: site.id, code: site.code });
	// One temperature log on the public 70 and one on a private site.
	const logOn = inserted.filter((s) => s.code === `MS${run}-P2` || s.code === `MS${run}-priv0`);
	await db.insert(temperatureLog).values(
		logOn.map((s) => ({
			siteId: s.id,
			name: 'log',
			depthM: [10, 20],
			temperatureC: [10, 11]
		}))
	);
	anonymous = new Client();
	outsider = await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD);
	member = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
});

afterAll(async () => {
	await db.delete(dataset).where(inArray(dataset.id, Object.values(datasets)));
	await sql.end();
});

interface Cell {
	count: number;
	meanMWm2: number | null;
	minMWm2: number | null;
	maxMWm2: number | null;
}

async function getJson(client: Client, path: string) {
	const res = await client.get(path);
	expect(res.status, await res.clone().text()).toBe(200);
	return res.json();
}

/** Only this run's sites (the box is ours, but the filter makes sure). */
const mine = `q=MS${run}`;

describe('/api/v1/map aggregates never include hidden sites', () => {
	it('counts and statistics of cells at world zoom, per viewer kind', async () => {
		for (const [client, hiddenSeen] of [
			[anonymous, false],
			[outsider, false],
			[member, true]
		] as const) {
			const body = await getJson(client, `/api/v1/map?bbox=${BOX}&zoom=3&${mine}`);
			expect(body.kind).toBe('cells');
			const cells: Cell[] = body.cells;
			// At zoom 3 the whole box is one cell (a cell is ~940 km wide).
			expect(cells).toHaveLength(1);
			expect(body.count).toBe(hiddenSeen ? 8 + 16 : 8);
			expect(cells[0].count).toBe(body.count);
			expect(cells[0].maxMWm2).toBe(hiddenSeen ? 500 : 100);
			if (!hiddenSeen) {
				// 50, 60, 70, 80, 100, 90, 90: mean 540 / 7.
				expect(cells[0].meanMWm2).toBeCloseTo(540 / 7, 1);
				// Cells carry no median (it would stop the database from hash-aggregating).
				expect(cells[0]).not.toHaveProperty('medianMWm2');
				expect(cells[0].minMWm2).toBe(50);
			}
		}
	});

	it('no cell exists only because of hidden sites (fine cells)', async () => {
		// At zoom 5 a cell is ~235 km (2.1°): HIDDEN_ONLY, 3.4° east and 3.5° north of the nearest
		// public site, is a cell of its own, for members only.
		const cellsOf = async (c: Client) =>
			(await getJson(c, `/api/v1/map?bbox=${BOX}&zoom=5&${mine}`)).cells as Cell[];
		const publicCells = await cellsOf(anonymous);
		expect(publicCells.every((c) => c.maxMWm2 !== 500)).toBe(true);
		expect(publicCells.reduce((n, c) => n + c.count, 0)).toBe(8);
		expect(await cellsOf(outsider)).toEqual(publicCells);
		const memberCells = await cellsOf(member);
		expect(memberCells.length).toBe(publicCells.length + 1);
	});

	it('single sites at high zoom, hidden ones only for members', async () => {
		const codes = async (c: Client) => {
			const body = await getJson(c, `/api/v1/map?bbox=${BOX}&zoom=12&${mine}`);
			expect(body.kind).toBe('sites');
			return (body.sites as { code: string }[]).map((s) => s.code).sort();
		};
		const open = await codes(anonymous);
		expect(open).toHaveLength(8);
		expect(open.some((c) => c.includes('priv') || c.includes('emb'))).toBe(false);
		expect(await codes(outsider)).toEqual(open);
		expect(await codes(member)).toHaveLength(24);
	});

	it('the matching count follows visibility', async () => {
		expect((await getJson(anonymous, `/api/v1/map/count?${mine}`)).count).toBe(8);
		expect((await getJson(outsider, `/api/v1/map/count?${mine}`)).count).toBe(8);
		expect((await getJson(member, `/api/v1/map/count?${mine}`)).count).toBe(24);
	});
});

describe('/api/v1/map honours every filter at low and high zoom', () => {
	const cases: [string, number][] = [
		['minHeatFlow=65', 5], // 70, 80, 100, 90, 90
		['maxHeatFlow=60', 2],
		['minHeatFlow=60&maxHeatFlow=80', 3],
		['quality=constrained', 2],
		['quality=well-constrained,indicative', 2],
		['organisation=org-lindmark-thermics', 2],
		['yearFrom=1990&yearTo=2000', 4], // 1990, 2000 and Lindmark's two of 2000
		['hasLog=1', 1],
		['method=marine_probe', 0]
	];
	for (const zoom of [3, 12]) {
		for (const [filter, expected] of cases) {
			it(`${filter} at zoom ${zoom}`, async () => {
				for (const client of [anonymous, member]) {
					const body = await getJson(
						client,
						`/api/v1/map?bbox=${BOX}&zoom=${zoom}&${mine}&${filter}`
					);
					// Members also see the hidden 500s; filter them out by value where a filter allows them.
					if (client === anonymous) expect(body.count).toBe(expected);
					else expect(body.count).toBeGreaterThanOrEqual(expected);
					const count = (await getJson(client, `/api/v1/map/count?${mine}&${filter}`)).count;
					expect(count).toBe(body.count);
				}
			});
		}
	}
	it('the dataset filter', async () => {
		const body = await getJson(anonymous, `/api/v1/map?bbox=${BOX}&zoom=3&dataset=${datasets.pub}`);
		expect(body.count).toBe(6);
		// A hidden dataset named in the filter still shows nothing.
		const hidden = await getJson(
			anonymous,
			`/api/v1/map?bbox=${BOX}&zoom=12&dataset=${datasets.priv}`
		);
		expect(hidden.count).toBe(0);
		expect(hidden.sites).toEqual([]);
	});
});

describe('/api/v1/map refuses malformed input with 400 and a message', () => {
	const bad: [string, string][] = [
		['/api/v1/map?zoom=3', 'bbox is required'],
		[`/api/v1/map?bbox=1,2,three,4&zoom=3`, 'east is not a number'],
		[`/api/v1/map?bbox=10,0,5,1&zoom=3`, 'west is east of east'],
		[`/api/v1/map?bbox=${BOX}`, 'zoom is required'],
		[`/api/v1/map?bbox=${BOX}&zoom=3.5`, 'zoom must be a whole number'],
		[`/api/v1/map?bbox=${BOX}&zoom=99`, 'zoom must be a whole number'],
		[`/api/v1/map?bbox=${BOX}&zoom=3&minHeatFlow=90&maxHeatFlow=40`, 'minimum heat flow is above'],
		[`/api/v1/map?bbox=${BOX}&zoom=3&quality=best`, 'unknown quality class'],
		[`/api/v1/map?bbox=${BOX}&zoom=3&yearFrom=abc`, 'first year must be'],
		[`/api/v1/map?bbox=${BOX}&zoom=3&hasLog=maybe`, 'hasLog must be'],
		[`/api/v1/map/count?dataset=nope`, 'is not an id'],
		[`/api/v1/map/region?minHeatFlow=1`, 'bbox is required'],
		[`/api/v1/map/search`, 'q is required'],
		[`/api/v1/map/search?q=${'x'.repeat(101)}`, 'longer than']
	];
	for (const [path, message] of bad) {
		it(path, async () => {
			// As a script asks (JSON), not as a browser page (which would get the HTML error page).
			const res = await fetch(testEnv.appUrl() + path);
			expect(res.status).toBe(400);
			expect((await res.json()).error.message).toContain(message);
		});
	}
});

describe('/api/v1/map/search', () => {
	it('finds visible sites by the start of a code or name, case-insensitive', async () => {
		const hits = async (c: Client, q: string) =>
			(
				(await getJson(c, `/api/v1/map/search?q=${encodeURIComponent(q)}`)).sites as {
					code: string;
				}[]
			).map((s) => s.code);
		expect(await hits(anonymous, `ms${run}-p1`)).toEqual([`MS${run}-P1`]);
		expect(await hits(anonymous, `SCALE WELL 3`)).toContain(`MS${run}-P3`);
		// A prefix, not "contains".
		expect(await hits(anonymous, `${run}-P1`)).toEqual([]);
		// Hidden sites are never found by those who may not see them.
		expect(await hits(anonymous, `MS${run}-priv`)).toEqual([]);
		expect(await hits(outsider, `Secret well`)).toEqual([]);
		expect((await hits(member, `MS${run}-priv`)).length).toBe(8);
	});
});

describe('/api/v1/map/region statistics', () => {
	it('match hand-computed values on a small set', async () => {
		// Values 50, 60, 70, 80, 100 (and one site without a value). By hand: mean 360/5 = 72;
		// median 70; sample variance ((-22)² + (-12)² + (-2)² + 8² + 28²) / 4 = 1480 / 4 = 370,
		// standard deviation √370 = 19.2354; P10 at rank 0.4 (linear between order statistics,
		// Hyndman & Fan 1996 definition 7, from memory) 50 + 0.4·10 = 54; P90 at rank 3.6:
		// 80 + 0.6·20 = 92.
		const stats = await getJson(
			anonymous,
			`/api/v1/map/region?bbox=${BOX}&dataset=${datasets.pub}`
		);
		expect(stats.count).toBe(6);
		expect(stats.withValue).toBe(5);
		expect(stats.meanMWm2).toBeCloseTo(72, 10);
		expect(stats.medianMWm2).toBeCloseTo(70, 10);
		expect(stats.stdDevMWm2).toBeCloseTo(Math.sqrt(370), 10);
		expect(stats.p10MWm2).toBeCloseTo(54, 10);
		expect(stats.p90MWm2).toBeCloseTo(92, 10);
		expect(stats.minMWm2).toBe(50);
		expect(stats.maxMWm2).toBe(100);
		expect(stats.histogram).toEqual([
			{ fromMWm2: 50, count: 1 },
			{ fromMWm2: 60, count: 1 },
			{ fromMWm2: 70, count: 1 },
			{ fromMWm2: 80, count: 1 },
			{ fromMWm2: 100, count: 1 }
		]);
		expect(stats.quality).toEqual([
			{ qualityClass: 'well-constrained', count: 1 },
			{ qualityClass: 'constrained', count: 2 },
			{ qualityClass: 'indicative', count: 1 },
			{ qualityClass: null, count: 2 }
		]);
	});

	it('never include hidden sites for those who may not see them', async () => {
		const of = async (c: Client) => getJson(c, `/api/v1/map/region?bbox=${BOX}&${mine}`);
		const open = await of(anonymous);
		expect(open.count).toBe(8);
		expect(open.maxMWm2).toBe(100);
		expect(await of(outsider)).toEqual(open);
		const seen = await of(member);
		expect(seen.count).toBe(24);
		expect(seen.maxMWm2).toBe(500);
	});
});

describe('map answers are cacheable per viewer only', () => {
	it('private, varies by cookie, ETag answered with 304', async () => {
		const url = `${testEnv.appUrl()}/api/v1/map?bbox=${BOX}&zoom=3&${mine}`;
		const first = await fetch(url);
		expect(first.status).toBe(200);
		expect(first.headers.get('cache-control')).toMatch(/^private/);
		expect(first.headers.get('vary')?.toLowerCase()).toContain('cookie');
		const etag = first.headers.get('etag');
		expect(etag).toBeTruthy();
		const again = await fetch(url, { headers: { 'if-none-match': etag! } });
		expect(again.status).toBe(304);
	});
});

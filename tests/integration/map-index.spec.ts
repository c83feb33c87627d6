import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ANONYMOUS, type Viewer } from '../../src/lib/server/access';
import { createDb } from '../../src/lib/server/db/client';
import {
	accessGrant,
	dataset,
	organisation,
	site,
	temperatureLog,
	type NewDataset,
	type NewSite
} from '../../src/lib/server/db/schema';
import {
	clearMapIndex,
	configureMapIndex,
	loadAll,
	planIndex
} from '../../src/lib/server/map-index/store';
import {
	countMatchingSites,
	indexedCells,
	mapCells,
	regionStatistics
} from '../../src/lib/server/repositories/map';
import type { Region } from '../../src/lib/map/region-shape';
import type { RegionStatistics } from '../../src/lib/map/region';
import { NO_FILTERS, type SiteFilters } from '../../src/lib/sites/filters';
import { SITE_FLAGS } from '../../src/lib/sites/flags';
import { HEAT_FLOW_METHODS } from '../../src/lib/sites/methods';
import { QUALITY_CLASSES } from '../../src/lib/sites/quality';
import { testEnv } from './env';

/*
 * The map's in-memory site index (src/lib/server/map-index) against the SQL it stands in for, on
 * invented data in a box of the southern Indian Ocean of its own (lon 60…66, lat -32…-26):
 * - `pub` (Korvald, published public) and `lind` (Lindmark, published public): 60 sites each;
 * - `priv` (private) and `emb` (embargoed to 2999), Korvald: 30 sites each at places of the public
 *   ones, all with heat flow 500, so a hidden site in an answer shows as a 500.
 * A grantee organisation of this run holds a grant on `emb` (not on `priv`).
 * Every attribute a filter reads varies (quality with none, method, heat flow with none, year with
 * none, flags, temperature logs). The same calls are made with the index loaded and with the index
 * turned off (THERMALITH_MAP_INDEX_MAX_SITES=0, all SQL), and must answer the same.
 */

const run = Date.now().toString(36);
const BOX = { west: 60, south: -32, east: 66, north: -26 };
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const datasets: Record<'pub' | 'lind' | 'priv' | 'emb', string> = {} as never;
const KORVALD = 'org-korvald-survey';
const GRANTEE_ORG = `org-idx-${run}`;
const viewers: Record<string, Viewer> = {
	anonymous: ANONYMOUS,
	member: { ...ANONYMOUS, userId: `idx-${run}-m`, roles: { [KORVALD]: 'viewer' } },
	outsider: { ...ANONYMOUS, userId: `idx-${run}-o`, roles: { 'org-lindmark-thermics': 'owner' } },
	grantee: { ...ANONYMOUS, userId: `idx-${run}-g`, roles: { [GRANTEE_ORG]: 'viewer' } }
};

const filterSets: Record<string, Partial<SiteFilters>> = {
	none: {},
	quality: { quality: ['constrained', 'indicative'] },
	method: { method: ['bullard', 'marine_probe'] },
	heatFlow: { minHeatFlow: 50, maxHeatFlow: 90 },
	years: { yearFrom: 1980, yearTo: 2000 },
	hasLog: { hasLog: true },
	flags: { flag: ['near-existing-site', 'heat-flow-implausible'] },
	organisation: { organisation: [KORVALD], minHeatFlow: 40 },
	combined: { quality: ['constrained'], minHeatFlow: 45, yearFrom: 1975 }
};
const filters = (name: string): SiteFilters => ({ ...NO_FILTERS, ...filterSets[name] });

const rect: Region = { kind: 'bbox', box: BOX };
const polygon: Region = {
	kind: 'polygon',
	ring: [
		[60.5, -31.5],
		[65.5, -31],
		[63, -26.5],
		[60.5, -31.5]
	]
};

/** A deterministic invented site of a dataset (i-th). */
function invented(key: keyof typeof datasets, i: number): NewSite {
	const hidden = key === 'priv' || key === 'emb';
	const j = hidden ? i * 2 : i; // hidden sites stand at places of public ones
	return {
		datasetId: datasets[key],
		code: `IX${run}-${key}${i}`,
		name: `Index well ${i}`,
		location: { lon: 60.05 + ((j * 37) % 59) / 10, lat: -31.95 + ((j * 53) % 59) / 10 },
		heatFlowMWm2: hidden ? 500 : i % 11 === 0 ? null : 30 + ((i * 17) % 80),
		method: HEAT_FLOW_METHODS[i % HEAT_FLOW_METHODS.length],
		qualityClass: i % 7 === 0 ? null : QUALITY_CLASSES[i % QUALITY_CLASSES.length],
		yearMeasured: i % 5 === 0 ? null : 1960 + ((i * 3) % 60),
		flags: i % 4 === 0 ? [SITE_FLAGS[(i / 4) % 3 === 0 ? 9 : 0]] : []
	};
}

beforeAll(async () => {
	const make = async (key: keyof typeof datasets, org: string, state: Partial<NewDataset>) => {
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: org,
				title: `Map index ${key} ${run}`,
				licence: 'CC-BY-4.0',
				...state
			} as NewDataset)
			.returning({ id: dataset.id });
		datasets[key] = d.id;
	};
	await make('pub', KORVALD, { status: 'published', visibility: 'public' });
	await make('lind', 'org-lindmark-thermics', { status: 'published', visibility: 'public' });
	await make('priv', KORVALD, { status: 'published', visibility: 'private' });
	await make('emb', KORVALD, {
		status: 'published',
		visibility: 'embargoed',
		embargoUntil: '2999-01-01'
	});
	const rows: NewSite[] = [];
	for (const key of ['pub', 'lind'] as const)
		for (let i = 0; i < 60; i++) rows.push(invented(key, i));
	for (const key of ['priv', 'emb'] as const)
		for (let i = 0; i < 30; i++) rows.push(invented(key, i));
	await db
		.insert(organisation)
		.values({ id: GRANTEE_ORG, name: `Map index grantee ${run}`, slug: `map-index-${run}` });
	await db.insert(accessGrant).values({ datasetId: datasets.emb, organisationId: GRANTEE_ORG });
	const inserted = await db.insert(site).values(rows).returning({ id: site.id, code: site.code });
	// Temperature logs on every sixth site (public and hidden).
	await db
		.insert(temperatureLog)
		.values(
			inserted
				.filter((_, i) => i % 6 === 0)
				.map((s) => ({ siteId: s.id, name: 'log', depthM: [10, 20], temperatureC: [10, 11] }))
		);
	clearMapIndex();
	configureMapIndex({ maxSites: 5_000_000 });
	await loadAll(db);
});

afterAll(async () => {
	configureMapIndex({ maxSites: 5_000_000 });
	clearMapIndex();
	await db.delete(dataset).where(inArray(dataset.id, Object.values(datasets)));
	await db.delete(organisation).where(eq(organisation.id, GRANTEE_ORG));
	await sql.end();
});

/** The same call answered from SQL only (index off), then turned back on. */
async function fromSql<T>(fn: () => Promise<T>): Promise<T> {
	configureMapIndex({ maxSites: 0 });
	try {
		return await fn();
	} finally {
		configureMapIndex({ maxSites: 5_000_000 });
	}
}

/** Statistics compared exactly, but mean and standard deviation to rounding (summation order). */
function expectSameStatistics(memory: RegionStatistics, sqlAnswer: RegionStatistics) {
	const { meanMWm2, stdDevMWm2, ...rest } = memory;
	const { meanMWm2: m2, stdDevMWm2: s2, ...rest2 } = sqlAnswer;
	expect(rest).toEqual(rest2);
	for (const [a, b] of [
		[meanMWm2, m2],
		[stdDevMWm2, s2]
	]) {
		if (b === null) expect(a).toBeNull();
		else expect(a).toBeCloseTo(b, 9);
	}
}

/** Whether all four datasets answer from memory for this viewer now. */
async function allInMemory(viewer: Viewer) {
	const plan = await planIndex(db, viewer, NO_FILTERS);
	return Object.values(datasets).filter((id) => plan.sqlDatasetIds.includes(id));
}

describe('the in-memory map index answers as SQL does', () => {
	it('is loaded for every dataset of the test', async () => {
		expect(await allInMemory(viewers.member)).toEqual([]);
	});

	for (const [who, viewer] of Object.entries(viewers)) {
		it(`cells at zooms 3, 6 and 9, counts and region statistics, ${who}, every filter`, async () => {
			for (const name of Object.keys(filterSets)) {
				const f = filters(name);
				for (const zoom of [3, 6, 9]) {
					const memory = await indexedCells(db, viewer, BOX, zoom, f);
					const expected = await fromSql(() => mapCells(db, viewer, BOX, zoom, f));
					expect(memory, `${name} at zoom ${zoom}`).toEqual(expected);
				}
				const count = await countMatchingSites(db, viewer, f);
				expect(count, name).toBe(await fromSql(() => countMatchingSites(db, viewer, f)));
				for (const region of [rect, polygon]) {
					const memory = await regionStatistics(db, viewer, region, f);
					const expected = await fromSql(() => regionStatistics(db, viewer, region, f));
					expectSameStatistics(memory, expected);
				}
			}
		});
	}

	it('never counts hidden sites for those who may not see them', async () => {
		for (const who of ['anonymous', 'outsider']) {
			const stats = await regionStatistics(db, viewers[who], rect, NO_FILTERS);
			expect(stats.count).toBe(120);
			expect(stats.maxMWm2).toBeLessThan(500);
			const cells = await indexedCells(db, viewers[who], BOX, 3, NO_FILTERS);
			expect(cells.reduce((n, c) => n + c.count, 0)).toBe(120);
		}
		const member = await regionStatistics(db, viewers.member, rect, NO_FILTERS);
		expect(member.count).toBe(180);
		expect(member.maxMWm2).toBe(500);
		// The grantee sees the embargoed dataset, not the private one.
		expect((await regionStatistics(db, viewers.grantee, rect, NO_FILTERS)).count).toBe(150);
	});

	it('decides per request which datasets count: a retired dataset leaves at once', async () => {
		const quality = { ...NO_FILTERS, quality: ['constrained' as const] };
		const before = await countMatchingSites(db, ANONYMOUS, quality);
		const inRegion = (await regionStatistics(db, ANONYMOUS, rect, quality)).count;
		await db.update(dataset).set({ status: 'retired' }).where(eq(dataset.id, datasets.lind));
		try {
			// No site changed, so no block is outdated; the dataset no longer counts all the same.
			expect(await allInMemory(ANONYMOUS)).toEqual([]);
			const after = await countMatchingSites(db, ANONYMOUS, quality);
			expect(after).toBe(await fromSql(() => countMatchingSites(db, ANONYMOUS, quality)));
			expect(after).toBeLessThan(before);
			const stats = await regionStatistics(db, ANONYMOUS, rect, quality);
			expect(stats.count).toBeLessThan(inRegion);
			expect(stats).toEqual(await fromSql(() => regionStatistics(db, ANONYMOUS, rect, quality)));
		} finally {
			await db.update(dataset).set({ status: 'published' }).where(eq(dataset.id, datasets.lind));
		}
	});
});

describe('a change to the sites', () => {
	it('shows at once (from SQL for that dataset) and from memory after the reload', async () => {
		const code = `IX${run}-pub1`;
		const region: Region = { kind: 'bbox', box: BOX };
		const only = { ...NO_FILTERS, minHeatFlow: 1000 };
		expect((await regionStatistics(db, ANONYMOUS, region, only)).count).toBe(0);
		await db.update(site).set({ heatFlowMWm2: 1234 }).where(eq(site.code, code));
		// The block of `pub` is outdated now: that dataset alone is answered from its sites.
		expect(await allInMemory(ANONYMOUS)).toEqual([datasets.pub]);
		const changed = await regionStatistics(db, ANONYMOUS, region, only);
		expect(changed).toMatchObject({ count: 1, maxMWm2: 1234 });
		expect(await countMatchingSites(db, ANONYMOUS, only)).toBe(
			await fromSql(() => countMatchingSites(db, ANONYMOUS, only))
		);
		await loadAll(db);
		expect(await allInMemory(ANONYMOUS)).toEqual([]);
		expect(await regionStatistics(db, ANONYMOUS, region, only)).toEqual(changed);
		const cells = await indexedCells(db, ANONYMOUS, BOX, 3, only);
		expect(cells).toEqual([expect.objectContaining({ count: 1, maxMWm2: 1234 })]);
	});

	it('a new temperature log changes the has-log filter at once', async () => {
		const withLog = { ...NO_FILTERS, hasLog: true };
		const before = await countMatchingSites(db, ANONYMOUS, withLog);
		const [s] = await db
			.select({ id: site.id })
			.from(site)
			.where(eq(site.code, `IX${run}-lind1`));
		await db
			.insert(temperatureLog)
			.values({ siteId: s.id, name: 'new log', depthM: [5], temperatureC: [9] });
		expect(await allInMemory(ANONYMOUS)).toEqual([datasets.lind]);
		expect(await countMatchingSites(db, ANONYMOUS, withLog)).toBe(before + 1);
		await loadAll(db);
		expect(await allInMemory(ANONYMOUS)).toEqual([]);
		expect(await countMatchingSites(db, ANONYMOUS, withLog)).toBe(before + 1);
	});
});

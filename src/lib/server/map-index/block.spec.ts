import { describe, expect, it } from 'vitest';
import { NO_FILTERS, type SiteFilters } from '$lib/sites/filters';
import { cellSizeM, toMercator } from '$lib/map/grid';
import { buildBlock, forEachInBox, indexCanAnswer, NO_YEAR, siteTest, type SiteRow } from './block';
import { blockCellParts, blockCount } from './cells';

const row = (over: Partial<SiteRow>): SiteRow => ({
	lon: 0,
	lat: 0,
	heatFlow: 60,
	quality: 'constrained',
	method: 'bullard',
	year: 1990,
	hasLog: false,
	flags: [],
	...over
});

const f = (over: Partial<SiteFilters>): SiteFilters => ({ ...NO_FILTERS, ...over });

/** Indices (in block order) of the sites passing a filter. */
function passing(rows: SiteRow[], filters: SiteFilters) {
	const b = buildBlock(rows);
	const test = siteTest(filters);
	const out: number[] = [];
	forEachInBox(b, { west: -180, south: -90, east: 180, north: 90 }, test, (i) =>
		out.push(b.lon[i])
	);
	return out;
}

describe('buildBlock', () => {
	it('sorts the sites by longitude and keeps each attribute with its site', () => {
		const b = buildBlock([
			row({ lon: 5, heatFlow: 50, year: null, quality: null }),
			row({ lon: -3, heatFlow: null, flags: ['heat-flow-missing'] })
		]);
		expect([...b.lon]).toEqual([-3, 5]);
		expect(b.heatFlow[0]).toBeNaN();
		expect(b.heatFlow[1]).toBe(50);
		expect(b.year[1]).toBe(NO_YEAR);
		expect(b.flags[0]).not.toBe(0);
		expect(b.flags[1]).toBe(0);
	});
});

describe('siteTest (the SQL filter conditions over typed arrays)', () => {
	// lon is used as the site's name here.
	const rows = [
		row({ lon: 1, heatFlow: 40, quality: 'well-constrained', year: 1970 }),
		row({ lon: 2, heatFlow: 80, method: 'marine_probe', year: null, hasLog: true }),
		row({ lon: 3, heatFlow: null, quality: null, flags: ['near-existing-site'] }),
		row({ lon: 4, heatFlow: 120, year: 2010, flags: ['heat-flow-implausible', 'year-implausible'] })
	];

	it('no filters pass everything', () => {
		expect(passing(rows, NO_FILTERS)).toEqual([1, 2, 3, 4]);
	});
	it('quality and method: a site without a class never matches a class', () => {
		expect(passing(rows, f({ quality: ['constrained'] }))).toEqual([2, 4]);
		expect(passing(rows, f({ method: ['marine_probe', 'other'] }))).toEqual([2]);
	});
	it('heat-flow range is inclusive and leaves out sites without a value', () => {
		expect(passing(rows, f({ minHeatFlow: 40, maxHeatFlow: 80 }))).toEqual([1, 2]);
		expect(passing(rows, f({ minHeatFlow: 0 }))).toEqual([1, 2, 4]);
	});
	it('year range is inclusive and leaves out sites without a year', () => {
		expect(passing(rows, f({ yearFrom: 1970, yearTo: 1990 }))).toEqual([1, 3]);
		expect(passing(rows, f({ yearTo: 3000 }))).toEqual([1, 3, 4]);
	});
	it('flags match any of the chosen ones; hasLog only sites with a log', () => {
		expect(passing(rows, f({ flag: ['year-implausible', 'near-existing-site'] }))).toEqual([3, 4]);
		expect(passing(rows, f({ hasLog: true }))).toEqual([2]);
	});
	it('the text search is left to SQL', () => {
		expect(indexCanAnswer(f({ q: 'abc' }))).toBe(false);
		expect(indexCanAnswer(f({ quality: ['constrained'] }))).toBe(true);
	});
});

describe('forEachInBox', () => {
	it('counts sites on the edges of the box (as PostGIS && does)', () => {
		const b = buildBlock([
			row({ lon: 10, lat: 20 }),
			row({ lon: 11, lat: 21 }),
			row({ lon: 11.0001, lat: 20.5 }),
			row({ lon: 10.5, lat: 19.9999 })
		]);
		expect(
			blockCount([b], siteTest(NO_FILTERS), { west: 10, south: 20, east: 11, north: 21 })
		).toBe(2);
	});
});

describe('blockCellParts', () => {
	it('groups sites into the cells of the map grid with count, sum, min and max', () => {
		// A reference grouping written independently, from grid.ts.
		const rows: SiteRow[] = [];
		for (let i = 0; i < 400; i++) {
			rows.push(
				row({
					lon: -30 + ((i * 7919) % 6000) / 100,
					lat: -40 + ((i * 104729) % 8000) / 100,
					heatFlow: i % 9 === 0 ? null : 20 + (i % 50)
				})
			);
		}
		for (const zoom of [3, 6, 9]) {
			const box = { west: -25, south: -30, east: 20, north: 35 };
			const expected = new Map<string, { count: number; withValue: number; sum: number }>();
			for (const r of rows) {
				if (r.lon < box.west || r.lon > box.east || r.lat < box.south || r.lat > box.north)
					continue;
				const [x, y] = toMercator(r.lon, r.lat);
				const key = `${Math.floor(x / cellSizeM(zoom))},${Math.floor(y / cellSizeM(zoom))}`;
				const c = expected.get(key) ?? { count: 0, withValue: 0, sum: 0 };
				c.count++;
				if (r.heatFlow !== null) {
					c.withValue++;
					c.sum += r.heatFlow;
				}
				expected.set(key, c);
			}
			const parts = blockCellParts(
				[buildBlock(rows.slice(0, 200)), buildBlock(rows.slice(200))],
				box,
				zoom,
				siteTest(NO_FILTERS)
			);
			const got = new Map<string, { count: number; withValue: number; sum: number }>();
			for (const p of parts) {
				const key = `${p.ix},${p.iy}`;
				const c = got.get(key) ?? { count: 0, withValue: 0, sum: 0 };
				c.count += p.count;
				c.withValue += p.withValue;
				c.sum += p.sumMWm2 ?? 0;
				got.set(key, c);
			}
			expect(got).toEqual(expected);
		}
	});
});

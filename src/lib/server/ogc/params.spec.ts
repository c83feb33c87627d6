import { describe, expect, it } from 'vitest';
import {
	MAX_LIMIT,
	parseBbox,
	parseCollectionId,
	parseCursor,
	parseDatetime,
	parseItemsQuery,
	parseLimit,
	yearRange
} from './params';

// Rules from OGC API – Features, Part 1: Core (OGC 17-069r4), clause 7.15; requirement ids named.

describe('limit (/req/core/fc-limit-definition, /req/core/fc-limit-response-1)', () => {
	it('defaults to 100 and uses the maximum for larger values instead of failing', () => {
		expect(parseLimit(null)).toEqual({ ok: true, value: 100 });
		expect(parseLimit('7')).toEqual({ ok: true, value: 7 });
		expect(parseLimit('20000')).toEqual({ ok: true, value: MAX_LIMIT });
	});

	it('refuses zero, negatives, fractions and words, naming the parameter', () => {
		for (const bad of ['0', '-1', '2.5', 'ten', '']) {
			const r = parseLimit(bad);
			expect(r.ok, bad).toBe(false);
			if (!r.ok) expect(r.parameter).toBe('limit');
		}
	});
});

describe('bbox (/req/core/fc-bbox-definition)', () => {
	it('reads four numbers as west, south, east, north', () => {
		expect(parseBbox('1,2,3,4')).toEqual({
			ok: true,
			value: { west: 1, south: 2, east: 3, north: 4 }
		});
	});

	it('reads six numbers as a box with heights (minimum height third)', () => {
		expect(parseBbox('1,2,-10,3,4,10')).toEqual({
			ok: true,
			value: { west: 1, south: 2, east: 3, north: 4 }
		});
	});

	it('keeps west > east: a box across the antimeridian', () => {
		expect(parseBbox('170,-10,-170,10')).toEqual({
			ok: true,
			value: { west: 170, south: -10, east: -170, north: 10 }
		});
	});

	it.each([
		['1,2,3', 'four numbers'],
		['1,2,3,4,5', 'four numbers'],
		['1,,3,4', 'value 2 is not a number'],
		['1,2,x,4', 'value 3 is not a number'],
		['1,4,3,2', 'south (4) is north of north (2)'],
		['-181,0,0,1', 'west must be between -180 and 180'],
		['0,0,1,95', 'north must be between -90 and 90'],
		['0,0,5,1,1,4', 'minimum height (5) is above the maximum (4)']
	])('refuses %s (%s)', (text, words) => {
		const r = parseBbox(text);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.message).toContain(words);
	});
});

describe('datetime (/req/core/fc-time-definition, /req/core/fc-time-response D–F)', () => {
	const t = (s: string) => Date.parse(s);

	it('reads an instant, a closed interval and half-open ones (".." or empty)', () => {
		expect(parseDatetime('2018-02-12T23:20:50Z')).toEqual({
			ok: true,
			value: { start: t('2018-02-12T23:20:50Z'), end: t('2018-02-12T23:20:50Z') }
		});
		expect(parseDatetime('2018-02-12T00:00:00Z/2018-03-18T12:31:12+01:00')).toEqual({
			ok: true,
			value: { start: t('2018-02-12T00:00:00Z'), end: t('2018-03-18T11:31:12Z') }
		});
		expect(parseDatetime('../2018-03-18T12:31:12Z')).toEqual({
			ok: true,
			value: { start: null, end: t('2018-03-18T12:31:12Z') }
		});
		expect(parseDatetime('2018-02-12T00:00:00Z/')).toEqual({
			ok: true,
			value: { start: t('2018-02-12T00:00:00Z'), end: null }
		});
	});

	it('refuses words, impossible dates, reversed intervals and two open ends', () => {
		for (const bad of [
			'soon',
			'2021-02-30',
			'2020-13-01',
			'2004-01-01/2003-01-01',
			'../..',
			'/',
			'a/b/c'
		]) {
			expect(parseDatetime(bad).ok, bad).toBe(false);
		}
	});

	it('a site measured in year Y covers all of Y: an interval selects the years it touches (UTC)', () => {
		expect(yearRange({ start: t('2003-12-31T23:00:00Z'), end: t('2004-01-01T00:00:00Z') })).toEqual(
			{ from: 2003, to: 2004 }
		);
		expect(yearRange({ start: null, end: t('1999-06-01T00:00:00Z') })).toEqual({
			from: null,
			to: 1999
		});
	});
});

describe('paging cursor and unknown parameters', () => {
	const id = '0f8fad5b-d9cb-469f-a165-70867728950e';

	it('takes after or before as a feature id, never both', () => {
		expect(parseCursor(new URLSearchParams(`after=${id}`))).toEqual({
			ok: true,
			value: { after: id }
		});
		expect(parseCursor(new URLSearchParams(`before=${id}`))).toEqual({
			ok: true,
			value: { before: id }
		});
		expect(parseCursor(new URLSearchParams(`after=${id}&before=${id}`)).ok).toBe(false);
		expect(parseCursor(new URLSearchParams('after=3')).ok).toBe(false);
	});

	it('refuses a parameter it does not know and a parameter given twice (/req/core/query-param-unknown)', () => {
		const unknown = parseItemsQuery(new URLSearchParams('offset=10'));
		expect(unknown).toMatchObject({ ok: false, parameter: 'offset' });
		expect(parseItemsQuery(new URLSearchParams('limit=1&limit=2'))).toMatchObject({
			ok: false,
			parameter: 'limit'
		});
		expect(parseItemsQuery(new URLSearchParams('f=json&limit=3'))).toMatchObject({
			ok: true,
			value: { limit: 3, bbox: null, datetime: null, cursor: null }
		});
	});
});

describe('collection ids', () => {
	it('knows "sites" and dataset-<uuid>, nothing else', () => {
		expect(parseCollectionId('sites')).toEqual({ kind: 'sites' });
		expect(parseCollectionId('dataset-0F8FAD5B-D9CB-469F-A165-70867728950E')).toEqual({
			kind: 'dataset',
			datasetId: '0f8fad5b-d9cb-469f-a165-70867728950e'
		});
		for (const bad of ['Sites', 'dataset-', 'dataset-12', '0f8fad5b-d9cb-469f-a165-70867728950e'])
			expect(parseCollectionId(bad), bad).toBeNull();
	});
});

describe('crs and bbox-crs (Part 2 names, CRS84 only)', () => {
	it('accepts CRS84 (also in brackets) and refuses any other CRS', () => {
		const crs84 = 'http://www.opengis.net/def/crs/OGC/1.3/CRS84';
		expect(parseItemsQuery(new URLSearchParams({ crs: crs84, 'bbox-crs': `[${crs84}]` })).ok).toBe(
			true
		);
		expect(
			parseItemsQuery(
				new URLSearchParams({ 'bbox-crs': 'http://www.opengis.net/def/crs/EPSG/0/3857' })
			)
		).toMatchObject({ ok: false, parameter: 'bbox-crs' });
	});
});

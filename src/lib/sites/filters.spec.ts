import { describe, expect, it } from 'vitest';
import {
	filtersToParams,
	isFiltered,
	NO_FILTERS,
	parseSiteFilters,
	siteFilterProblems
} from './filters';

// Thermalith's own URL conventions (no external source).
describe('site filters in the URL', () => {
	it('round-trip through query parameters', () => {
		const f = parseSiteFilters(
			new URLSearchParams(
				'quality=well-constrained,constrained&method=bullard&minHeatFlow=40&maxHeatFlow=120.5&q=KGS&page=2' +
					'&organisation=org-a&dataset=5a0c1d3e-0000-4000-8000-000000000001&yearFrom=1970&yearTo=1990&hasLog=1' +
					'&flag=near-existing-site,heat-flow-negative'
			)
		);
		expect(f).toEqual({
			quality: ['well-constrained', 'constrained'],
			method: ['bullard'],
			minHeatFlow: 40,
			maxHeatFlow: 120.5,
			q: 'KGS',
			organisation: ['org-a'],
			dataset: ['5a0c1d3e-0000-4000-8000-000000000001'],
			yearFrom: 1970,
			yearTo: 1990,
			hasLog: true,
			flag: ['near-existing-site', 'heat-flow-negative'],
			page: 2
		});
		expect(parseSiteFilters(filtersToParams(f))).toEqual(f);
	});
	it('accept repeated parameters from a plain HTML form, each value once', () => {
		expect(
			parseSiteFilters(new URLSearchParams('method=bullard&method=marine_probe,bullard')).method
		).toEqual(['bullard', 'marine_probe']);
	});
	it('read a submitted form the same way as a URL', () => {
		const form = new URLSearchParams([
			['quality', 'indicative'],
			['minHeatFlow', ''],
			['maxHeatFlow', '90']
		]);
		expect(parseSiteFilters(form)).toMatchObject({
			quality: ['indicative'],
			minHeatFlow: null,
			maxHeatFlow: 90
		});
	});
	it('ignore unknown values and non-numbers instead of failing the map', () => {
		expect(
			parseSiteFilters(
				new URLSearchParams(
					'quality=excellent&method=dowsing&minHeatFlow=abc&maxHeatFlow=Infinity&page=0'
				)
			)
		).toEqual(NO_FILTERS);
		expect(filtersToParams(NO_FILTERS).toString()).toBe('');
	});
});

describe('isFiltered', () => {
	it('is true for any narrowing filter and false for a page number alone', () => {
		expect(isFiltered(parseSiteFilters(new URLSearchParams('page=3')))).toBe(false);
		expect(isFiltered(parseSiteFilters(new URLSearchParams('q=KGS')))).toBe(true);
		expect(isFiltered(parseSiteFilters(new URLSearchParams('maxHeatFlow=0')))).toBe(true);
	});
});

// Thermalith's own rules for what the filter panel refuses (no external source).
describe('site filter problems', () => {
	const problems = (q: string) => siteFilterProblems(new URLSearchParams(q));
	it('are none for good or empty filters', () => {
		expect(problems('')).toEqual([]);
		expect(
			problems('quality=constrained&minHeatFlow=40&maxHeatFlow=40&yearFrom=1970&yearTo=1970')
		).toEqual([]);
	});
	it('name impossible ranges', () => {
		expect(problems('minHeatFlow=90&maxHeatFlow=40')).toEqual([
			'the minimum heat flow is above the maximum'
		]);
		expect(problems('yearFrom=1990&yearTo=1980')).toEqual([
			'the first year is after the last year'
		]);
	});
	it('name malformed values', () => {
		expect(problems('minHeatFlow=abc')).toEqual(['the minimum heat flow must be a number']);
		expect(problems('yearTo=19.5')).toEqual([
			'the last year must be a whole year from 1800 to 2100'
		]);
		expect(problems('quality=best')).toEqual(['unknown quality class "best"']);
		expect(problems('dataset=not-a-uuid')).toEqual(['dataset "not-a-uuid" is not an id']);
		expect(problems('hasLog=maybe')).toEqual(['hasLog must be 1 or 0']);
		expect(problems('flag=heat-flow-negative,bogus')).toEqual(['unknown flag "bogus"']);
	});
});

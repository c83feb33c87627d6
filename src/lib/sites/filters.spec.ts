import { describe, expect, it } from 'vitest';
import { filtersToParams, isFiltered, NO_FILTERS, parseSiteFilters } from './filters';

// Thermalith's own URL conventions (no external source).
describe('site filters in the URL', () => {
	it('round-trip through query parameters', () => {
		const f = parseSiteFilters(
			new URLSearchParams(
				'quality=well-constrained,constrained&method=bullard&minHeatFlow=40&maxHeatFlow=120.5&q=KGS&page=2'
			)
		);
		expect(f).toEqual({
			quality: ['well-constrained', 'constrained'],
			method: ['bullard'],
			minHeatFlow: 40,
			maxHeatFlow: 120.5,
			q: 'KGS',
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

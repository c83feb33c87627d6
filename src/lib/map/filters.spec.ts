import { describe, expect, it } from 'vitest';
import { filtersToParams, NO_FILTERS, parseSiteFilters } from './filters';

// Thermalith's own URL conventions (no external source).
describe('map filters in the URL', () => {
	it('round-trip through query parameters', () => {
		const f = parseSiteFilters(
			new URLSearchParams(
				'quality=well-constrained,constrained&method=bullard&minHeatFlow=40&maxHeatFlow=120.5'
			)
		);
		expect(f).toEqual({
			quality: ['well-constrained', 'constrained'],
			method: ['bullard'],
			minHeatFlowMWm2: 40,
			maxHeatFlowMWm2: 120.5
		});
		expect(parseSiteFilters(filtersToParams(f))).toEqual(f);
	});
	it('accept repeated parameters from a plain HTML form', () => {
		expect(
			parseSiteFilters(new URLSearchParams('method=bullard&method=marine_probe')).method
		).toEqual(['bullard', 'marine_probe']);
	});
	it('ignore unknown values and non-numbers instead of failing the map', () => {
		expect(
			parseSiteFilters(
				new URLSearchParams('quality=excellent&method=dowsing&minHeatFlow=abc&maxHeatFlow=Infinity')
			)
		).toEqual(NO_FILTERS);
		expect(filtersToParams(NO_FILTERS).toString()).toBe('');
	});
});

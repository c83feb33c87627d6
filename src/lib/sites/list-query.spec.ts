import { describe, expect, it } from 'vitest';
import { MAX_PAGE } from './filters';
import { parseSiteListQuery, withQuery } from './list-query';

// Thermalith's own URL conventions (no external source).
describe('sites table query', () => {
	it('reads known parameters and keeps them in links', () => {
		const q = parseSiteListQuery(
			new URLSearchParams('sort=heatFlowMWm2&dir=desc&q=KGS&quality=constrained&page=3')
		);
		expect(q).toMatchObject({
			sort: 'heatFlowMWm2',
			dir: 'desc',
			q: 'KGS',
			quality: ['constrained'],
			page: 3
		});
		expect(withQuery(q, { page: 4 })).toBe(
			'?sort=heatFlowMWm2&dir=desc&quality=constrained&q=KGS&page=4'
		);
	});
	it('takes the map filters too, so a map link narrows the table the same way', () => {
		const q = parseSiteListQuery(
			new URLSearchParams('quality=well-constrained,constrained&method=bullard&minHeatFlow=40')
		);
		expect(q).toMatchObject({
			quality: ['well-constrained', 'constrained'],
			method: ['bullard'],
			minHeatFlow: 40,
			maxHeatFlow: null
		});
	});
	it('falls back to defaults for unknown or malicious values', () => {
		const q = parseSiteListQuery(new URLSearchParams('sort=password;drop&dir=sideways&page=-2'));
		expect(q).toMatchObject({ sort: 'code', dir: 'asc', page: 1, quality: [] });
		expect(withQuery(q, {})).toBe('?');
	});
});

// Values that reached PostgreSQL as they were and answered 500 (NUL in text, OFFSET beyond bigint).
describe('sites table query: hostile values', () => {
	it('keeps page a small positive integer', () => {
		for (const page of ['1e300', '9007199254740993', '1000001', '1.5', 'NaN', 'Infinity', '']) {
			expect(parseSiteListQuery(new URLSearchParams({ page })).page, page).toBe(1);
		}
		expect(parseSiteListQuery(new URLSearchParams({ page: String(MAX_PAGE) })).page).toBe(MAX_PAGE);
	});

	it('drops control characters from the search and unknown filter values', () => {
		const q = parseSiteListQuery(
			new URLSearchParams({ q: 'KGS\u0000-0\t1', quality: 'x\u0000', method: "bullard'--" })
		);
		expect(q).toMatchObject({ q: 'KGS-01', quality: [], method: [] });
		expect(parseSiteListQuery(new URLSearchParams({ method: 'marine_probe' })).method).toEqual([
			'marine_probe'
		]);
	});
});

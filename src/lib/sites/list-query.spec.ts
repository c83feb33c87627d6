import { describe, expect, it } from 'vitest';
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
			quality: 'constrained',
			page: 3
		});
		expect(withQuery(q, { page: 4 })).toBe(
			'?sort=heatFlowMWm2&dir=desc&q=KGS&quality=constrained&page=4'
		);
	});
	it('falls back to defaults for unknown or malicious values', () => {
		const q = parseSiteListQuery(new URLSearchParams('sort=password;drop&dir=sideways&page=-2'));
		expect(q).toMatchObject({ sort: 'code', dir: 'asc', page: 1, quality: null });
		expect(withQuery(q, {})).toBe('?');
	});
});

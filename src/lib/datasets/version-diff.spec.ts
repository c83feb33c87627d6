import { describe, expect, it } from 'vitest';
import { diffValue, diffVersions } from './version-diff';

/* Matching by site code and comparing field by field (common practice, no source). */
describe('diffVersions', () => {
	const fields = ['name', 'heatFlowMWm2', 'location', 'corrections'];
	const v1 = [
		{ code: 'A', name: 'Alpha', heatFlowMWm2: 60, location: { lon: 1, lat: 2 }, corrections: [] },
		{ code: 'B', name: 'Beta', heatFlowMWm2: 70, location: { lon: 3, lat: 4 }, corrections: [] },
		{ code: 'C', name: null, heatFlowMWm2: 80, location: { lon: 5, lat: 6 }, corrections: ['t'] }
	];

	it('finds added, removed and changed sites, field by field', () => {
		const v2 = [
			{ ...v1[0] },
			{ ...v1[1], heatFlowMWm2: 72.5, location: { lon: 3, lat: 4.1 } },
			{ code: 'D', name: 'Delta', heatFlowMWm2: 50, location: { lon: 0, lat: 0 }, corrections: [] }
		];
		expect(diffVersions(v1, v2, fields)).toEqual({
			added: ['D'],
			removed: ['C'],
			changed: [
				{
					code: 'B',
					changes: [
						{ field: 'heatFlowMWm2', before: 70, after: 72.5 },
						{ field: 'location', before: { lon: 3, lat: 4 }, after: { lon: 3, lat: 4.1 } }
					]
				}
			],
			unchanged: 1
		});
	});

	it('treats null and a missing value alike, and compares lists by content', () => {
		const v2 = v1.map((s) => ({ ...s, corrections: [...s.corrections] }));
		delete (v2[2] as Record<string, unknown>).name;
		expect(diffVersions(v1, v2, fields).changed).toEqual([]);
	});

	it('shows values readably', () => {
		expect(diffValue(null)).toBe('—');
		expect(diffValue(['a', 'b'])).toBe('a, b');
		expect(diffValue({ lon: 1.5, lat: -2 })).toBe('1.5, -2');
		expect(diffValue(61.2)).toBe('61.2');
	});
});

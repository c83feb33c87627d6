import { describe, expect, it } from 'vitest';
import { maskByDistance } from './mask';
import type { GridSpec, Sample } from './types';

describe('maskByDistance', () => {
	const grid: GridSpec = { x0: 0, y0: 0, dx: 100, dy: 100, nx: 4, ny: 2 };
	const samples: Sample[] = [{ x: 50, y: 50, value: 1 }];

	it('sets cells whose centre is farther than the distance from every sample to NaN', () => {
		const values = Float64Array.from({ length: 8 }, (_, k) => k);
		// Centres: (50,50) d=0; (150,50) d=100; (250,50) d=200; (50,150) d=100; (150,150) d≈141.
		const out = maskByDistance(values, grid, samples, 141);
		expect(Array.from(out)).toEqual([0, 1, NaN, NaN, 4, NaN, NaN, NaN]);
		expect(Array.from(values)).toEqual([0, 1, 2, 3, 4, 5, 6, 7]); // input untouched
		expect(maskByDistance(values, grid, samples, 142)[5]).toBe(5);
	});

	it('rejects a bad distance or a wrong-sized array', () => {
		expect(() => maskByDistance(new Float64Array(8), grid, samples, 0)).toThrow(
			expect.objectContaining({ field: 'maxDistanceM' })
		);
		expect(() => maskByDistance(new Float64Array(7), grid, samples, 10)).toThrow(
			expect.objectContaining({ field: 'values' })
		);
	});
});

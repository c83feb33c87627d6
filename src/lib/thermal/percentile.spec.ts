import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { percentilesInPlace, selectInPlace } from './percentile';
import { expectClose } from '../foundation/testing';

// Type-7 definition (Hyndman & Fan 1996): value at h = (n − 1) p, linear between order statistics.
function bySorting(values: number[], p: number): number {
	const s = [...values].sort((a, b) => a - b);
	const h = (s.length - 1) * p;
	const k = Math.floor(h);
	return k + 1 < s.length ? s[k] + (h - k) * (s[k + 1] - s[k]) : s[k];
}

describe('percentiles by selection (type 7, Hyndman & Fan 1996)', () => {
	it('gives the type-7 values for 1…10 by hand: P10 = 1.9, P50 = 5.5, P90 = 9.1', () => {
		const a = Float64Array.from([7, 3, 10, 1, 5, 9, 2, 8, 4, 6]);
		const [p10, p50, p90] = percentilesInPlace(a, [0.1, 0.5, 0.9]);
		expectClose(p10, 1.9, { abs: 1e-12 }, 'P10');
		expectClose(p50, 5.5, { abs: 1e-12 }, 'P50');
		expectClose(p90, 9.1, { abs: 1e-12 }, 'P90');
	});

	it('handles ties, one value and +Infinity', () => {
		expect(percentilesInPlace(Float64Array.from([2, 2, 2, 2]), [0.1, 0.5, 0.9])).toEqual([2, 2, 2]);
		expect(percentilesInPlace(Float64Array.from([4]), [0.1, 0.9])).toEqual([4, 4]);
		const withInf = percentilesInPlace(Float64Array.from([1, 2, Infinity, Infinity]), [0.1, 0.9]);
		expectClose(withInf[0], 1.3, { abs: 1e-12 }, 'P10');
		expect(withInf[1]).toBe(Infinity);
	});

	it('matches sorting on random arrays (property)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 300 }),
				(values) => {
					const got = percentilesInPlace(Float64Array.from(values), [0.1, 0.5, 0.9]);
					[0.1, 0.5, 0.9].forEach((p, i) =>
						expectClose(got[i], bySorting(values, p), { abs: 1e-9 }, `p${p}`)
					);
				}
			),
			{ numRuns: 300 }
		);
	});

	it('partitions around the selected element', () => {
		const a = Float64Array.from([5, 1, 4, 1, 5, 9, 2, 6, 5, 3, 5]);
		selectInPlace(a, 4);
		for (let i = 0; i < 4; i++) expect(a[i]).toBeLessThanOrEqual(a[4]);
		for (let i = 5; i < a.length; i++) expect(a[i]).toBeGreaterThanOrEqual(a[4]);
		expect(a[4]).toBe(4);
	});
});

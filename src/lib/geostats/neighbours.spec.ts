import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { NeighbourIndex } from './neighbours';

describe('NeighbourIndex.nearest (own k-nearest search on kdbush)', () => {
	it('agrees with brute force (distances, nearest first)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.tuple(fc.integer({ min: 0, max: 1000 }), fc.integer({ min: 0, max: 1000 })), {
					minLength: 1,
					maxLength: 300
				}),
				fc.tuple(
					fc.double({ min: -100, max: 1100, noNaN: true }),
					fc.double({ min: -100, max: 1100, noNaN: true })
				),
				fc.integer({ min: 1, max: 40 }),
				fc.option(fc.double({ min: 1, max: 800, noNaN: true }), { nil: undefined }),
				(points, [qx, qy], k, r) => {
					const xs = Float64Array.from(points, (p) => p[0]);
					const ys = Float64Array.from(points, (p) => p[1]);
					const index = new NeighbourIndex(xs, ys);
					const idx = new Int32Array(k);
					const d2 = new Float64Array(k);
					const n = index.nearest(qx, qy, k, r ?? Infinity, idx, d2);
					const all = points
						.map((p) => (p[0] - qx) ** 2 + (p[1] - qy) ** 2)
						.filter((d) => r === undefined || d <= r * r)
						.sort((a, b) => a - b)
						.slice(0, k);
					expect(n).toBe(all.length);
					expect(Array.from(d2.subarray(0, n))).toEqual(all);
					for (let q = 0; q < n; q++) {
						const p = points[idx[q]];
						expect((p[0] - qx) ** 2 + (p[1] - qy) ** 2).toBe(d2[q]);
					}
					expect(new Set(idx.subarray(0, n)).size).toBe(n);
				}
			),
			{ numRuns: 200 }
		);
	});

	it('handles an empty index', () => {
		const index = new NeighbourIndex(new Float64Array(0), new Float64Array(0));
		expect(index.nearest(0, 0, 3, Infinity, new Int32Array(3), new Float64Array(3))).toBe(0);
		expect(index.within(0, 0, 10)).toEqual([]);
	});
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { percentilesInPlace } from './percentile';
import { createRandom } from '../foundation/random';
import { PercentileTracker } from './tracker';

const P = [0.1, 0.5, 0.9];
const type7 = ([lo, hi, w]: [number, number, number]) => (w === 0 ? lo : lo + w * (hi - lo));

describe('percentile tracker (exact type-7 percentiles of slowly changing columns; Hyndman & Fan 1996)', () => {
	it('equals selection on every column of a drifting random walk, including sudden reshuffles', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 2, max: 3000 }),
				fc.integer(),
				fc.double({ min: 0, max: 2, noNaN: true }),
				(n, seed, drift) => {
					const r = createRandom(seed);
					const column = Float64Array.from({ length: n }, () => r.normal());
					const rates = Float64Array.from({ length: n }, () => r.normal());
					const tracker = new PercentileTracker(n, P);
					for (let step = 0; step < 30; step++) {
						if (step === 15)
							for (let s = 0; s < n; s++) column[s] = r.uniform(); // reshuffle
						else for (let s = 0; s < n; s++) column[s] += drift * rates[s] * 0.05;
						const got = tracker.update(column).map(type7);
						const want = percentilesInPlace(column.slice(), P);
						expect(got).toEqual(want);
					}
				}
			),
			{ numRuns: 40 }
		);
	});

	it('handles ties (a constant column)', () => {
		const tracker = new PercentileTracker(100, P);
		expect(tracker.update(new Float64Array(100).fill(7)).map(type7)).toEqual([7, 7, 7]);
	});
});

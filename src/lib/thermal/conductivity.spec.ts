import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	arithmeticMeanWmK,
	geometricMeanWmK,
	harmonicMeanWmK,
	matrixConductivityWmK,
	porousRockConductivityWmK
} from './conductivity';
import { expectClose, thrown } from '../foundation/testing';

describe('mean conductivities (common practice, no source)', () => {
	it('computes the three means of 2 and 4 by hand: 8/3, √8, 3', () => {
		expectClose(harmonicMeanWmK([2, 4]), 8 / 3, { abs: 1e-12 }, 'harmonic');
		expectClose(geometricMeanWmK([2, 4]), Math.SQRT2 * 2, { abs: 1e-12 }, 'geometric');
		expectClose(arithmeticMeanWmK([2, 4]), 3, { abs: 1e-12 }, 'arithmetic');
	});
	it('weights by thickness: 300 m of k = 2 over 100 m of k = 4 → harmonic 400/175', () => {
		expectClose(harmonicMeanWmK([2, 4], [300, 100]), 400 / 175, { abs: 1e-12 }, 'harmonic');
		expectClose(arithmeticMeanWmK([2, 4], [300, 100]), 2.5, { abs: 1e-12 }, 'arithmetic');
	});
	it('orders harmonic <= geometric <= arithmetic (HM–GM–AM inequality) for random layers', () => {
		const layer = fc.tuple(
			fc.double({ min: 0.1, max: 10, noNaN: true }),
			fc.double({ min: 1, max: 1000, noNaN: true })
		);
		fc.assert(
			fc.property(fc.array(layer, { minLength: 1, maxLength: 12 }), (ls) => {
				const k = ls.map((l) => l[0]);
				const w = ls.map((l) => l[1]);
				const [h, g, a] = [harmonicMeanWmK(k, w), geometricMeanWmK(k, w), arithmeticMeanWmK(k, w)];
				expect(h).toBeLessThanOrEqual(g * (1 + 1e-12));
				expect(g).toBeLessThanOrEqual(a * (1 + 1e-12));
			})
		);
	});
	it('rejects empty, non-positive and mismatched input', () => {
		expect(thrown(() => harmonicMeanWmK([])).field).toBe('conductivityWmK');
		expect(thrown(() => harmonicMeanWmK([2, 0])).field).toBe('conductivityWmK[1]');
		expect(thrown(() => geometricMeanWmK([2, 3], [1])).field).toBe('weights');
	});
});

describe('porous rock, geometric mixing k = k_m^(1−φ) k_f^φ (common practice, no source)', () => {
	it('mixes a 3 W/m/K matrix with 20 % water (0.6) into 2.1743390 W/m/K (evaluated independently in Python)', () => {
		expectClose(porousRockConductivityWmK(3, 0.2), 2.174338991, { abs: 1e-9 }, 'k');
		expect(porousRockConductivityWmK(3, 0)).toBe(3);
		expectClose(porousRockConductivityWmK(3, 1), 0.6, { abs: 1e-15 }, 'pure fluid');
	});
	it('inverts to the matrix conductivity', () => {
		expectClose(
			matrixConductivityWmK(porousRockConductivityWmK(3.7, 0.15, 0.58), 0.15, 0.58),
			3.7,
			{ rel: 1e-12 },
			'k_m'
		);
	});
	it('rejects porosity outside 0…1', () => {
		expect(thrown(() => porousRockConductivityWmK(3, 1.2)).field).toBe('porosity');
	});
});

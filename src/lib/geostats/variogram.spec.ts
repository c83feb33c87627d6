import { describe, expect, it } from 'vitest';
import { InputError } from '../foundation/errors';
import type { Variogram } from './types';
import { covarianceFunction, semivariance, sill } from './variogram';

const sph: Variogram = { model: 'spherical', nugget: 2, partialSill: 10, rangeM: 1000 };
const exp: Variogram = { model: 'exponential', nugget: 2, partialSill: 10, rangeM: 1000 };
const gau: Variogram = { model: 'gaussian', nugget: 2, partialSill: 10, rangeM: 1000 };

describe('semivariance formulas (Cressie 1993, §2.3.1; practical range for exp/gau)', () => {
	it('is 0 at h = 0 and jumps to the nugget just above it', () => {
		for (const v of [sph, exp, gau]) {
			expect(semivariance(v, 0)).toBe(0);
			expect(semivariance(v, 1e-9)).toBeCloseTo(2, 6);
		}
	});

	it('spherical: nugget + c(1.5 h/a − 0.5 (h/a)³) below the range', () => {
		// h = 500: 1.5·0.5 − 0.5·0.125 = 0.6875 → 2 + 6.875
		expect(semivariance(sph, 500)).toBeCloseTo(8.875, 12);
		// h = 250: 0.375 − 0.5·0.015625 = 0.3671875
		expect(semivariance(sph, 250)).toBeCloseTo(2 + 3.671875, 12);
	});

	it('spherical reaches the sill exactly at the range and stays there', () => {
		expect(semivariance(sph, 1000)).toBe(12);
		expect(semivariance(sph, 999.999)).toBeLessThan(12);
		expect(semivariance(sph, 5000)).toBe(12);
	});

	it('exponential: nugget + c(1 − exp(−3h/a))', () => {
		expect(semivariance(exp, 500)).toBeCloseTo(2 + 10 * (1 - Math.exp(-1.5)), 12);
		expect(semivariance(exp, 1000)).toBeCloseTo(2 + 10 * (1 - Math.exp(-3)), 12);
		// At the practical range γ − nugget is 1 − e⁻³ ≈ 95.0 % of the partial sill.
		expect((semivariance(exp, 1000) - 2) / 10).toBeCloseTo(0.9502, 4);
	});

	it('gaussian: nugget + c(1 − exp(−3h²/a²))', () => {
		expect(semivariance(gau, 500)).toBeCloseTo(2 + 10 * (1 - Math.exp(-0.75)), 12);
		expect((semivariance(gau, 1000) - 2) / 10).toBeCloseTo(0.9502, 4);
	});

	it('is non-decreasing in h (common practice, no source: bounded models)', () => {
		for (const v of [sph, exp, gau]) {
			let last = 0;
			for (let h = 0; h <= 3000; h += 37) {
				const g = semivariance(v, h);
				expect(g).toBeGreaterThanOrEqual(last);
				last = g;
			}
			expect(last).toBeLessThanOrEqual(sill(v));
		}
	});

	it('covariance is sill − γ, with C(0) = sill', () => {
		for (const v of [sph, exp, gau]) {
			const c = covarianceFunction(v);
			expect(c(0)).toBe(12);
			for (const h of [1, 100, 700, 1000, 2500]) {
				expect(c(h)).toBeCloseTo(sill(v) - semivariance(v, h), 12);
			}
		}
	});
});

describe('semivariance input errors', () => {
	const bad: [string, Variogram, number, string][] = [
		['zero range', { ...sph, rangeM: 0 }, 1, 'v.rangeM'],
		['negative range', { ...sph, rangeM: -5 }, 1, 'v.rangeM'],
		['NaN range', { ...sph, rangeM: NaN }, 1, 'v.rangeM'],
		['zero partial sill', { ...sph, partialSill: 0 }, 1, 'v.partialSill'],
		['Infinity partial sill', { ...sph, partialSill: Infinity }, 1, 'v.partialSill'],
		['negative nugget', { ...sph, nugget: -1 }, 1, 'v.nugget'],
		['unknown model', { ...sph, model: 'cubic' as never }, 1, 'v.model'],
		['negative h', sph, -1, 'hM'],
		['NaN h', sph, NaN, 'hM']
	];
	it.each(bad)('%s names %s', (_, v, h, field) => {
		expect(() => semivariance(v, h)).toThrow(InputError);
		try {
			semivariance(v, h);
		} catch (e) {
			expect((e as InputError).field).toBe(field);
		}
	});
});

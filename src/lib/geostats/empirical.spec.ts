import { describe, expect, it } from 'vitest';
import { defaultLagClasses, empiricalVariogram } from './empirical';
import { InputError } from '../foundation/errors';
import { loadFixture } from './fixtures/load';
import type { Sample } from './types';

interface GstatFixture {
	samples: Sample[];
	empirical: { lagM: number; lags: number; classes: { np: number; dist: number; gamma: number }[] };
}
const gstat = loadFixture<GstatFixture>('gstat.json');

describe('empiricalVariogram lag classes [k·lag, (k+1)·lag), hM = mean pair distance (Cressie 1993; default lags common practice, no source)', () => {
	// Four samples on a line at x = 0, 100, 250, 400 (invented).
	const s: Sample[] = [
		{ x: 0, y: 0, value: 1 },
		{ x: 100, y: 0, value: 3 },
		{ x: 250, y: 0, value: 2 },
		{ x: 400, y: 0, value: 6 }
	];
	// Pair distances: 100, 250, 400, 150, 300, 150.

	it('puts h exactly on a boundary in the upper class and drops h ≥ lags·lag', () => {
		const ev = empiricalVariogram(s, { lagM: 100, lags: 4 });
		// class 1 [100, 200): 100 (1,3), 150 (3,2), 150 (2,6) → γ = (4 + 1 + 16)/6
		// class 2 [200, 300): 250 (1,2) → γ = 1/2
		// class 3 [300, 400): 300 (3,6) → γ = 9/2; h = 400 is outside [0, 400)
		expect(ev).toEqual([
			{ hM: 400 / 3, gamma: 21 / 6, pairs: 3 },
			{ hM: 250, gamma: 0.5, pairs: 1 },
			{ hM: 300, gamma: 4.5, pairs: 1 }
		]);
	});

	it('omits empty classes (class 0 has no pair here)', () => {
		const ev = empiricalVariogram(s, { lagM: 100, lags: 5 });
		expect(ev.map((p) => p.pairs)).toEqual([3, 1, 1, 1]);
		expect(ev[3]).toEqual({ hM: 400, gamma: 12.5, pairs: 1 });
	});

	it('matches gstat variogram() with boundaries 0, 1000, …, 8000 (fixtures/gstat-reference.R)', () => {
		const ev = empiricalVariogram(gstat.samples, {
			lagM: gstat.empirical.lagM,
			lags: gstat.empirical.lags
		});
		expect(ev).toHaveLength(gstat.empirical.classes.length);
		ev.forEach((p, k) => {
			const ref = gstat.empirical.classes[k];
			expect(p.pairs).toBe(ref.np);
			expect(p.hM).toBeCloseTo(ref.dist, 8);
			expect(p.gamma).toBeCloseTo(ref.gamma, 10);
		});
	});

	it('defaults to half the bounding-box diagonal split into 15 lags', () => {
		const d = defaultLagClasses([
			{ x: 0, y: 0, value: 1 },
			{ x: 3000, y: 4000, value: 2 }
		]);
		expect(d).toEqual({ lagM: 2500 / 15, lags: 15 });
		expect(defaultLagClasses(s, { lags: 5 }).lagM).toBeCloseTo(200 / 5, 12);
	});

	it('rejects bad lag options and NaN values with the field named', () => {
		expect(() => empiricalVariogram(s, { lagM: 0, lags: 3 })).toThrow(
			expect.objectContaining({ field: 'opts.lagM' })
		);
		expect(() => empiricalVariogram(s, { lagM: 10, lags: 1.5 })).toThrow(
			expect.objectContaining({ field: 'opts.lags' })
		);
		expect(() =>
			empiricalVariogram([...s, { x: 1, y: 1, value: NaN }], { lagM: 10, lags: 3 })
		).toThrow(InputError);
	});
});

describe('empiricalVariogram pair subsample above maxPairs (seeded Bernoulli sampling, common practice, no source)', () => {
	const pairs = (gstat.samples.length * (gstat.samples.length - 1)) / 2;

	it('uses every pair up to maxPairs, the same classes as without the option', () => {
		const all = empiricalVariogram(gstat.samples, gstat.empirical);
		expect(empiricalVariogram(gstat.samples, { ...gstat.empirical, maxPairs: pairs })).toEqual(all);
	});

	it('keeps about maxPairs pairs, the same ones on every call', () => {
		const opts = { ...gstat.empirical, maxPairs: Math.round(pairs / 2) };
		const a = empiricalVariogram(gstat.samples, opts);
		const b = empiricalVariogram(gstat.samples, opts);
		expect(b).toEqual(a);
		const inRange = empiricalVariogram(gstat.samples, gstat.empirical).reduce(
			(t, p) => t + p.pairs,
			0
		);
		const kept = a.reduce((t, p) => t + p.pairs, 0);
		// Each pair in the lag range is kept with probability ½: within 5 σ of inRange / 2.
		expect(Math.abs(kept - inRange / 2)).toBeLessThan(5 * Math.sqrt(inRange / 4));
	});

	it('rejects a maxPairs that is not a positive integer', () => {
		expect(() => empiricalVariogram(gstat.samples, { ...gstat.empirical, maxPairs: 0.5 })).toThrow(
			expect.objectContaining({ field: 'opts.maxPairs' })
		);
	});
});

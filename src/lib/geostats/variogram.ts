import { InputError } from '../foundation/errors';
import { requireFinite } from '../foundation/validate';
import { validateVariogram } from './validate';
import type { Variogram, VariogramModel } from './types';

/*
 * Variogram models (Matheron 1963; Cressie 1993, §2.3.1). γ(0) = 0 and the nugget applies
 * for h > 0, so the model is discontinuous at the origin when the nugget is non-zero.
 * Exponential and gaussian use the practical range a (γ ≈ 95 % of the sill at h = a):
 * the factor 3 gives 1 − e⁻³ ≈ 0.950 (common practice, no source).
 */

/** Normalised structure function f(h) ∈ [0, 1], with γ(h) = nugget + partialSill · f(h) for h > 0. */
export function structure(model: VariogramModel, hM: number, rangeM: number): number {
	const r = hM / rangeM;
	switch (model) {
		case 'spherical':
			return r >= 1 ? 1 : r * (1.5 - 0.5 * r * r);
		case 'exponential':
			return 1 - Math.exp(-3 * r);
		case 'gaussian':
			return 1 - Math.exp(-3 * r * r);
	}
}

/** Semivariance γ(h) in value-unit² at separation hM (metres, ≥ 0); γ(0) = 0. */
export function semivariance(v: Variogram, hM: number): number {
	validateVariogram(v);
	requireFinite('hM', hM);
	if (hM < 0) throw new InputError('hM', hM, 'must be ≥ 0');
	if (hM === 0) return 0;
	return v.nugget + v.partialSill * structure(v.model, hM, v.rangeM);
}

/** Total sill (nugget + partial sill) in value-unit². */
export function sill(v: Variogram): number {
	return v.nugget + v.partialSill;
}

/**
 * Returns an unchecked covariance function C(h) = sill − γ(h) of distance in metres, for
 * inner loops: C(0) = sill, C(h > 0) = partialSill · (1 − f(h)). The kriging code is
 * written in covariance form (Cressie 1993, §3.2) because a bounded variogram has one, and
 * the covariance matrix with 1s bordering it is what the LU solver sees.
 */
export function covarianceFunction(v: Variogram): (hM: number) => number {
	const c = v.partialSill;
	const s = v.nugget + v.partialSill;
	const a = v.rangeM;
	switch (v.model) {
		case 'spherical':
			return (h) => {
				if (h === 0) return s;
				if (h >= a) return 0;
				const r = h / a;
				return c * (1 - r * (1.5 - 0.5 * r * r));
			};
		case 'exponential': {
			const k = 3 / a;
			return (h) => (h === 0 ? s : c * Math.exp(-k * h));
		}
		case 'gaussian': {
			const k = 3 / (a * a);
			return (h) => (h === 0 ? s : c * Math.exp(-k * h * h));
		}
	}
}

// Palaeoclimate correction for a step change of surface temperature. A step ΔTs at time t before
// present perturbs a half-space by ΔT(z) = ΔTs erfc(z / (2√(κ t))) (Carslaw & Jaeger); steps add by
// superposition because conduction is linear. The perturbation is relative to the geotherm the
// ground would have if the surface had stayed at its pre-step temperature, so subtracting it from
// a log gives that undisturbed geotherm (and the undisturbed gradient, which is what heat flow needs).

import { erfc } from './erfc';
import { InputError } from '../foundation/errors';
import { kPerMToKPerKm, SECONDS_PER_YEAR } from '../geo/units';
import { requireFinite, requireNonNegative, requirePositive } from '../foundation/validate';

/** Thermal diffusivity of crustal rock, m²/s (about 1e-6: common practice, no source). */
export const DEFAULT_DIFFUSIVITY_M2S = 1e-6;

/** A surface temperature step of stepC (°C, positive = warming) that happened ageYears ago. */
export interface SurfaceTemperatureStep {
	stepC: number;
	ageYears: number;
}

function checkSteps(steps: readonly SurfaceTemperatureStep[], diffusivityM2s: number): void {
	if (!Array.isArray(steps)) throw new InputError('steps', steps, 'must be an array');
	steps.forEach((s, i) => {
		requireFinite(`steps[${i}].stepC`, s.stepC);
		requirePositive(`steps[${i}].ageYears`, s.ageYears);
	});
	requirePositive('diffusivityM2s', diffusivityM2s);
}

/** Present-day temperature perturbation (°C) at depthM (m) from past surface steps. */
export function palaeoclimatePerturbationC(
	steps: readonly SurfaceTemperatureStep[],
	depthM: number,
	diffusivityM2s = DEFAULT_DIFFUSIVITY_M2S
): number {
	checkSteps(steps, diffusivityM2s);
	requireNonNegative('depthM', depthM);
	let dt = 0;
	for (const s of steps) {
		const t = s.ageYears * SECONDS_PER_YEAR;
		dt += s.stepC * erfc(depthM / (2 * Math.sqrt(diffusivityM2s * t)));
	}
	return dt;
}

/** Present-day gradient perturbation (K/km) at depthM: d/dz of the above, −ΔTs e^(−z²/4κt)/√(πκt). */
export function palaeoclimateGradientPerturbationKPerKm(
	steps: readonly SurfaceTemperatureStep[],
	depthM: number,
	diffusivityM2s = DEFAULT_DIFFUSIVITY_M2S
): number {
	checkSteps(steps, diffusivityM2s);
	requireNonNegative('depthM', depthM);
	let g = 0;
	for (const s of steps) {
		const kt = diffusivityM2s * s.ageYears * SECONDS_PER_YEAR;
		g -= (s.stepC * Math.exp(-(depthM * depthM) / (4 * kt))) / Math.sqrt(Math.PI * kt);
	}
	return kPerMToKPerKm(g);
}

/** A temperature log (°C) with the palaeoclimate perturbation removed, at the same depths (m). */
export function correctLogForPalaeoclimate(
	depthM: readonly number[],
	temperatureC: readonly number[],
	steps: readonly SurfaceTemperatureStep[],
	diffusivityM2s = DEFAULT_DIFFUSIVITY_M2S
): number[] {
	if (depthM.length !== temperatureC.length) {
		throw new InputError(
			'temperatureC',
			temperatureC.length,
			`must have one value per depth (${depthM.length})`
		);
	}
	return depthM.map((z, i) => {
		requireFinite(`temperatureC[${i}]`, temperatureC[i]);
		return temperatureC[i] - palaeoclimatePerturbationC(steps, z, diffusivityM2s);
	});
}

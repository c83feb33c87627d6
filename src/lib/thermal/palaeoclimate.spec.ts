import { describe, expect, it } from 'vitest';
import {
	correctLogForPalaeoclimate,
	palaeoclimateGradientPerturbationKPerKm,
	palaeoclimatePerturbationC
} from './palaeoclimate';
import { SECONDS_PER_YEAR } from '../geo/units';
import { expectClose, thrown } from '../foundation/testing';

// Invented history: the surface warmed by 2 °C 150 years ago; κ = 1e-6 m²/s (common practice).
const warming = [{ stepC: 2, ageYears: 150 }];
const diffusionLengthM = 2 * Math.sqrt(1e-6 * 150 * SECONDS_PER_YEAR); // 2√(κt) ≈ 137.7 m

describe('palaeoclimate step, ΔT(z) = ΔTs erfc(z / 2√(κt)) (Carslaw & Jaeger)', () => {
	it('equals the step at the surface and ΔTs·erfc(1) = 2·0.1572992071 at z = 2√(κt) (A&S Table 7.1)', () => {
		expectClose(palaeoclimatePerturbationC(warming, 0), 2, { abs: 1e-15 }, 'z = 0');
		expectClose(
			palaeoclimatePerturbationC(warming, diffusionLengthM),
			2 * 0.1572992071,
			{ abs: 1e-9 },
			'z = 2√κt'
		);
		expect(palaeoclimatePerturbationC(warming, 5000)).toBeLessThan(1e-12);
	});

	it('superposes steps and has a gradient that matches a finite difference', () => {
		const history = [...warming, { stepC: -1, ageYears: 20_000 }];
		const z = 300;
		expectClose(
			palaeoclimatePerturbationC(history, z),
			palaeoclimatePerturbationC(warming, z) + palaeoclimatePerturbationC([history[1]], z),
			{ abs: 1e-15 },
			'superposition'
		);
		const fd =
			((palaeoclimatePerturbationC(history, z + 0.01) -
				palaeoclimatePerturbationC(history, z - 0.01)) /
				0.02) *
			1000;
		expectClose(palaeoclimateGradientPerturbationKPerKm(history, z), fd, { rel: 1e-6 }, 'dΔT/dz');
	});

	it('removes the perturbation from a synthetic log, leaving the undisturbed linear geotherm', () => {
		const depthM = [0, 50, 100, 200, 400];
		const logC = depthM.map((z) => 8 + 0.025 * z + palaeoclimatePerturbationC(warming, z));
		const corrected = correctLogForPalaeoclimate(depthM, logC, warming);
		corrected.forEach((t, i) =>
			expectClose(t, 8 + 0.025 * depthM[i], { abs: 1e-12 }, `T(${depthM[i]})`)
		);
	});

	it('rejects non-positive ages and diffusivities, and negative depths', () => {
		expect(thrown(() => palaeoclimatePerturbationC([{ stepC: 1, ageYears: 0 }], 10)).field).toBe(
			'steps[0].ageYears'
		);
		expect(thrown(() => palaeoclimatePerturbationC(warming, 10, -1)).field).toBe('diffusivityM2s');
		expect(thrown(() => palaeoclimatePerturbationC(warming, -10)).field).toBe('depthM');
	});
});

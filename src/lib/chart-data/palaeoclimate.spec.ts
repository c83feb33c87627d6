import { describe, expect, it } from 'vitest';
import { palaeoclimateChartData } from './palaeoclimate';
import { erfc } from '$lib/thermal';
import { SECONDS_PER_YEAR } from '$lib/geo/units';
import { expectClose, thrown } from '../foundation/testing';

// A warming of 2 °C 10 000 years ago (κ = 1e-6 m²/s) perturbs the log by 2 erfc(z / 2√(κt))
// (Carslaw & Jaeger 1959; docs/science.md#borehole-heat-flow). Invented log: 10 °C + 25 K/km,
// plus that perturbation, so the correction must give back the straight 25 K/km line.
const steps = [{ stepC: 2, ageYears: 10_000 }];
const kt = 1e-6 * 10_000 * SECONDS_PER_YEAR;
const depthM = [50, 100, 200, 300, 400, 600, 800];
const undisturbed = depthM.map((z) => 10 + 0.025 * z);
const measured = depthM.map((z, i) => undisturbed[i] + 2 * erfc(z / (2 * Math.sqrt(kt))));

describe('palaeoclimate view model', () => {
	it('removes the perturbation and gives back the undisturbed gradient', () => {
		const d = palaeoclimateChartData(depthM, measured, steps);
		d.correctedC.forEach((t, i) =>
			expectClose(t, undisturbed[i], { abs: 1e-9 }, `T(${depthM[i]})`)
		);
		expectClose(d.gradientAfterKPerKm, 25, { abs: 1e-9 }, 'corrected gradient');
		// The warming makes the measured gradient smaller near the surface.
		expect(d.gradientBeforeKPerKm).toBeLessThan(25);
		expectClose(d.maxPerturbationC, 2 * erfc(50 / (2 * Math.sqrt(kt))), { abs: 1e-12 }, 'max');
		expect(d.perturbationC).toHaveLength(depthM.length);
	});

	it('passes the core’s input errors on, naming the step', () => {
		expect(
			thrown(() => palaeoclimateChartData(depthM, measured, [{ stepC: 1, ageYears: 0 }])).field
		).toBe('steps[0].ageYears');
	});
});

// Chart data for a palaeoclimate correction of a log: measured and corrected temperature against
// depth, and the perturbation removed (docs/science.md#borehole-heat-flow; Carslaw & Jaeger 1959).
// The physics is the thermal core's; this pairs the two profiles and the gradients before and after.

import {
	correctLogForPalaeoclimate,
	palaeoclimatePerturbationC,
	temperatureGradient,
	DEFAULT_DIFFUSIVITY_M2S,
	type SurfaceTemperatureStep
} from '$lib/thermal';

export interface PalaeoclimateChartData {
	depthM: number[];
	measuredC: number[];
	correctedC: number[];
	perturbationC: number[];
	gradientBeforeKPerKm: number;
	gradientAfterKPerKm: number;
	/** Largest |perturbation| along the log, signed (°C). */
	maxPerturbationC: number;
}

/** Measured and corrected profiles of a log; throws InputError like the core. */
export function palaeoclimateChartData(
	depthM: readonly number[],
	temperatureC: readonly number[],
	steps: readonly SurfaceTemperatureStep[],
	diffusivityM2s = DEFAULT_DIFFUSIVITY_M2S
): PalaeoclimateChartData {
	const correctedC = correctLogForPalaeoclimate(depthM, temperatureC, steps, diffusivityM2s);
	const perturbationC = depthM.map((z) => palaeoclimatePerturbationC(steps, z, diffusivityM2s));
	const before = temperatureGradient({ depthM: [...depthM], temperatureC: [...temperatureC] });
	const after = temperatureGradient({ depthM: [...depthM], temperatureC: correctedC });
	const maxPerturbationC = perturbationC.reduce((m, p) => (Math.abs(p) > Math.abs(m) ? p : m), 0);
	return {
		depthM: [...depthM],
		measuredC: [...temperatureC],
		correctedC,
		perturbationC,
		gradientBeforeKPerKm: before.gradientKPerKm,
		gradientAfterKPerKm: after.gradientKPerKm,
		maxPerturbationC
	};
}

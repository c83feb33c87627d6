// First-order (linearised) uncertainty of the uniform single-layer geotherm
// T(z) = T0 + q0 z/k − A z²/(2k) (Turcotte & Schubert ch. 4), with the derivatives in docs/science.md#uncertainty (Taylor 1997 ch. 3):
// ∂T/∂q0 = z/k, ∂T/∂A = −z²/(2k), ∂T/∂k = −(q0 z − A z²/2)/k², inputs independent.
// Good while relative uncertainties are small; use monteCarloGeotherm otherwise.

import { requireFinite, requireNonNegative, requirePositive } from '../foundation/validate';
import { mWm2ToWm2, uWm3ToWm3 } from '../geo/units';

/** z of the standard normal at the 90th percentile (A&S Table 26.5; 1.2815515655, from memory). */
export const NORMAL_Z90 = 1.2815515655446004;

export interface UniformUncertaintyInput {
	surfaceTemperatureC: number;
	surfaceHeatFlowMWm2: number;
	sigmaSurfaceHeatFlowMWm2: number;
	conductivityWmK: number;
	sigmaConductivityWmK: number;
	heatProductionUWm3: number;
	sigmaHeatProductionUWm3: number;
}

export interface LinearisedBand {
	depthM: number[];
	temperatureC: number[];
	sigmaC: number[];
	p10C: number[];
	p90C: number[];
}

/** Temperature (°C) and its first-order standard deviation (°C) at each depth (m), uniform case. */
export function uniformTemperatureBand(
	input: UniformUncertaintyInput,
	depthM: readonly number[]
): LinearisedBand {
	requireFinite('surfaceTemperatureC', input.surfaceTemperatureC);
	requireFinite('surfaceHeatFlowMWm2', input.surfaceHeatFlowMWm2);
	requirePositive('conductivityWmK', input.conductivityWmK);
	requireNonNegative('heatProductionUWm3', input.heatProductionUWm3);
	requireNonNegative('sigmaSurfaceHeatFlowMWm2', input.sigmaSurfaceHeatFlowMWm2);
	requireNonNegative('sigmaConductivityWmK', input.sigmaConductivityWmK);
	requireNonNegative('sigmaHeatProductionUWm3', input.sigmaHeatProductionUWm3);
	const q0 = mWm2ToWm2(input.surfaceHeatFlowMWm2);
	const sq = mWm2ToWm2(input.sigmaSurfaceHeatFlowMWm2);
	const k = input.conductivityWmK;
	const sk = input.sigmaConductivityWmK;
	const a = uWm3ToWm3(input.heatProductionUWm3);
	const sa = uWm3ToWm3(input.sigmaHeatProductionUWm3);
	const out: LinearisedBand = {
		depthM: [...depthM],
		temperatureC: [],
		sigmaC: [],
		p10C: [],
		p90C: []
	};
	depthM.forEach((z, i) => {
		requireFinite(`depthM[${i}]`, z);
		const t = input.surfaceTemperatureC + (q0 * z) / k - (a * z * z) / (2 * k);
		const dq = z / k;
		const da = -(z * z) / (2 * k);
		const dk = -(q0 * z - (a * z * z) / 2) / (k * k);
		const sigma = Math.sqrt((dq * sq) ** 2 + (da * sa) ** 2 + (dk * sk) ** 2);
		out.temperatureC.push(t);
		out.sigmaC.push(sigma);
		out.p10C.push(t - NORMAL_Z90 * sigma);
		out.p90C.push(t + NORMAL_Z90 * sigma);
	});
	return out;
}

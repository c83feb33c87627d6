// General steady 1-D solver for properties that vary with depth and temperature: the first-order
// system dT/dz = q/k(T, z), dq/dz = −A(z) (docs/science.md#steady-conduction) integrated with classical fourth-order
// Runge–Kutta. Use it when no closed form applies; solveGeotherm (closed form) is exact otherwise.
// Properties must be smooth inside a segment: the integrator lands exactly on segment boundaries,
// so jumps between segments do not spoil the fourth-order convergence.
// Assumptions: steady state, one dimension, conduction only; no advection, no transients.

import { InputError } from '../foundation/errors';
import { plausibilityWarnings, validateLayer } from './geotherm';
import { conductivityAtTemperatureWmK } from './layer';
import { sampleDepthsM } from './sampling';
import type { CrustLayer, GeothermProfile } from './types';
import { SOLVER_INTEGRATION_STEP_M, SOLVER_OUTPUT_STEP_M } from '../foundation/limits';
import { requireFinite, requirePositive } from '../foundation/validate';
import { mWm2ToWm2, uWm3ToWm3, wm2ToMWm2 } from '../geo/units';

/** A depth interval with smooth properties; depths passed to the callbacks are absolute (m). */
export interface NumericalSegment {
	thicknessM: number;
	conductivityWmK: (temperatureC: number, depthM: number) => number;
	heatProductionUWm3: (depthM: number) => number;
}

/** Input of the numerical solver; exactly one boundary heat flow, like GeothermInput. */
export interface NumericalGeothermInput {
	surfaceTemperatureC: number;
	surfaceHeatFlowMWm2?: number;
	basalHeatFlowMWm2?: number;
	segments: NumericalSegment[];
	depthStepM?: number; // output spacing (m), default SOLVER_OUTPUT_STEP_M
	integrationStepM?: number; // largest RK4 step (m), default SOLVER_INTEGRATION_STEP_M
}

/** Segments with the same properties as CrustLayers, for the numerical solver. */
export function segmentsFromLayers(layers: readonly CrustLayer[]): NumericalSegment[] {
	layers.forEach(validateLayer);
	let topM = 0;
	return layers.map((layer) => {
		const top = topM;
		topM += layer.thicknessM;
		const k0 = layer.conductivityWmK;
		const b = layer.conductivityTempCoeffPerK ?? 0;
		const a = layer.heatProductionUWm3;
		const h = layer.heatProductionDecayM ?? Infinity;
		return {
			thicknessM: layer.thicknessM,
			conductivityWmK: (t: number) => conductivityAtTemperatureWmK(k0, b, t),
			heatProductionUWm3: h === Infinity ? () => a : (z: number) => a * Math.exp(-(z - top) / h)
		};
	});
}

/** Solves dT/dz = q/k(T,z), dq/dz = −A(z) by RK4; same sampling and units as solveGeotherm. */
export function solveGeothermNumerical(input: NumericalGeothermInput): GeothermProfile {
	requireFinite('surfaceTemperatureC', input.surfaceTemperatureC);
	const hasSurface = input.surfaceHeatFlowMWm2 != null;
	if (hasSurface === (input.basalHeatFlowMWm2 != null)) {
		throw new InputError(
			'surfaceHeatFlowMWm2',
			input.surfaceHeatFlowMWm2,
			'give exactly one of surfaceHeatFlowMWm2 and basalHeatFlowMWm2'
		);
	}
	const bcValue = (hasSurface ? input.surfaceHeatFlowMWm2 : input.basalHeatFlowMWm2) as number;
	requireFinite(hasSurface ? 'surfaceHeatFlowMWm2' : 'basalHeatFlowMWm2', bcValue);
	if (!Array.isArray(input.segments) || input.segments.length === 0) {
		throw new InputError('segments', input.segments, 'must be a non-empty array');
	}
	input.segments.forEach((s, i) => requirePositive(`segments[${i}].thicknessM`, s.thicknessM));
	const maxStep = input.integrationStepM ?? SOLVER_INTEGRATION_STEP_M;
	requirePositive('integrationStepM', maxStep);
	const outStep = input.depthStepM ?? SOLVER_OUTPUT_STEP_M;
	requirePositive('depthStepM', outStep);

	const bases: number[] = [];
	let acc = 0;
	for (const s of input.segments) bases.push((acc += s.thicknessM));
	const depthM = sampleDepthsM(bases, outStep);

	// Heat flow does not depend on T, so the basal condition maps to a surface one through ∫A dz,
	// integrated with the same sub-steps (RK4 on dq/dz = −A(z) is Simpson's rule).
	let q0Wm2 = mWm2ToWm2(bcValue);
	if (!hasSurface) q0Wm2 += integrateProductionWm2(input.segments, bases, depthM, maxStep);

	const temperatureC = new Array<number>(depthM.length);
	const heatFlowMWm2 = new Array<number>(depthM.length);
	let t = input.surfaceTemperatureC;
	let q = q0Wm2;
	temperatureC[0] = t;
	heatFlowMWm2[0] = wm2ToMWm2(q);
	let seg = 0;
	for (let i = 1; i < depthM.length; i++) {
		const za = depthM[i - 1];
		const zb = depthM[i];
		while (seg < bases.length - 1 && za >= bases[seg]) seg++; // the interval [za, zb] lies inside segment `seg`
		const { conductivityWmK: k, heatProductionUWm3: a } = input.segments[seg];
		const n = Math.max(1, Math.ceil((zb - za) / maxStep - 1e-9));
		const h = (zb - za) / n;
		for (let j = 0; j < n; j++) {
			const z = za + j * h;
			const zm = z + h / 2;
			const z1 = j === n - 1 ? zb : z + h;
			const a0 = uWm3ToWm3(a(z));
			const am = uWm3ToWm3(a(zm));
			const a1 = uWm3ToWm3(a(z1));
			// Classical RK4 on y = (T, q), f = (q/k(T, z), −A(z)); the q-stages are q + h/2·k1q,
			// q + h/2·k2q and q + h·k3q with k1q = −A(z), k2q = k3q = −A(z + h/2).
			const kt1 = q / k(t, z);
			const kt2 = (q - (h / 2) * a0) / k(t + (h / 2) * kt1, zm);
			const kt3 = (q - (h / 2) * am) / k(t + (h / 2) * kt2, zm);
			const kt4 = (q - h * am) / k(t + h * kt3, z1);
			t += (h / 6) * (kt1 + 2 * kt2 + 2 * kt3 + kt4);
			q -= (h * (a0 + 4 * am + a1)) / 6;
		}
		temperatureC[i] = t;
		heatFlowMWm2[i] = wm2ToMWm2(q);
		if (!Number.isFinite(t)) {
			throw new InputError(`segments[${seg}]`, t, `give a non-finite temperature at ${zb} m`);
		}
	}
	return {
		depthM,
		temperatureC,
		heatFlowMWm2,
		surfaceHeatFlowMWm2: hasSurface ? bcValue : wm2ToMWm2(q0Wm2),
		basalHeatFlowMWm2: hasSurface ? wm2ToMWm2(q) : bcValue,
		layerBaseDepthsM: bases,
		warnings: plausibilityWarnings(
			hasSurface ? bcValue : wm2ToMWm2(q0Wm2),
			hasSurface ? wm2ToMWm2(q) : bcValue,
			hasSurface ? 'surface' : 'basal'
		)
	};
}

function integrateProductionWm2(
	segments: readonly NumericalSegment[],
	bases: readonly number[],
	depthM: readonly number[],
	maxStep: number
): number {
	let total = 0;
	let seg = 0;
	for (let i = 1; i < depthM.length; i++) {
		const za = depthM[i - 1];
		const zb = depthM[i];
		while (seg < bases.length - 1 && za >= bases[seg]) seg++;
		const a = segments[seg].heatProductionUWm3;
		const n = Math.max(1, Math.ceil((zb - za) / maxStep - 1e-9));
		const h = (zb - za) / n;
		for (let j = 0; j < n; j++) {
			const z = za + j * h;
			total += (h * (a(z) + 4 * a(z + h / 2) + a(j === n - 1 ? zb : z + h))) / 6;
		}
	}
	return uWm3ToWm3(total);
}

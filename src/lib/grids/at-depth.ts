import { InputError } from '../foundation/errors';
import {
	NORMAL_Z90,
	solveGeotherm,
	temperatureAtDepthC,
	type GeothermInput,
	type GeothermProfile
} from '../thermal';
import { firstCrossingM } from '../thermal/derived';
import { atDepthAssumptions, CRUST_MODELS, DEFAULT_CRUST_MODEL } from './crust-models';

/**
 * Temperature at a depth and depth of an isotherm for every cell of a heat-flow grid, through the
 * thermal core's steady conductive geotherm in a chosen crust (crust-models.ts; default the
 * site model's three-layer crust). With constant conductivities the
 * geotherm is affine in the surface heat flow q0 (T(z; q0) = T(z; qa) + (q0 − qa) · ∂T/∂q0, the
 * conduction equation being linear), so two solved profiles give every cell exactly.
 *
 * P10–P90 come from the heat-flow σ alone (normal, ± NORMAL_Z90 σ): temperature rises and the
 * isotherm depth falls with q0, so the percentiles map through the monotone relation. Crustal
 * uncertainty is not included. P10 is the 10th percentile (thermal/README.md).
 */

export const DEFAULT_AT_DEPTH_M = 3000;
export const DEFAULT_ISOTHERM_C = 150;
/** The assumptions of the default crust (the status document's `atDepthAssumptions`). */
export const AT_DEPTH_ASSUMPTIONS = atDepthAssumptions(CRUST_MODELS[DEFAULT_CRUST_MODEL]);

/** A crust in the thermal core's input shape, without the boundary heat flow. */
export type AtDepthCrust = Pick<GeothermInput, 'surfaceTemperatureC' | 'layers'>;
const DEFAULT_CRUST: AtDepthCrust = CRUST_MODELS[DEFAULT_CRUST_MODEL];

const Q_A = 60;
const Q_B = 100;

/** The two reference profiles (mW/m² at the surface). */
function references(crust: AtDepthCrust): [GeothermProfile, GeothermProfile] {
	// The affine shortcut is exact only with constant conductivities.
	if (crust.layers.some((l) => l.conductivityTempCoeffPerK))
		throw new InputError(
			'layers',
			null,
			'must have conductivities constant with temperature for the at-depth maps'
		);
	const solve = (q: number) =>
		solveGeotherm({
			surfaceTemperatureC: crust.surfaceTemperatureC,
			layers: crust.layers,
			surfaceHeatFlowMWm2: q,
			depthStepM: 50
		});
	return [solve(Q_A), solve(Q_B)];
}

export interface Percentiles {
	p10: Float32Array;
	p50: Float32Array;
	p90: Float32Array;
}

/** Per cell: temperature (°C) at depthM, NaN where the heat flow is NaN. */
export function temperatureAtDepthGrid(
	value: Float32Array,
	sigma: Float32Array | null,
	depthM = DEFAULT_AT_DEPTH_M,
	crust: AtDepthCrust = DEFAULT_CRUST
): Percentiles {
	const [a, b] = references(crust);
	const ta = temperatureAtDepthC(a, depthM);
	const slope = (temperatureAtDepthC(b, depthM) - ta) / (Q_B - Q_A);
	const at = (q: number) => ta + (q - Q_A) * slope;
	const out = {
		p10: new Float32Array(value.length),
		p50: new Float32Array(value.length),
		p90: new Float32Array(value.length)
	};
	for (let c = 0; c < value.length; c++) {
		const q = value[c];
		const s = sigma ? sigma[c] : NaN;
		out.p50[c] = at(q);
		out.p10[c] = at(q - NORMAL_Z90 * s);
		out.p90[c] = at(q + NORMAL_Z90 * s);
	}
	return out;
}

/**
 * The depth (m) of an isotherm as a function of the surface heat flow, for the affine family
 * T(z_k; q) = Ta_k + (q − qa) · g_k. Own code (science): with g_k > 0 the profile is at or
 * above the isotherm at depth k exactly when q ≥ qk_k = qa + (Tc − Ta_k) / g_k, so the first
 * depth reached is the first k whose running minimum of qk_k is ≤ q: a binary search instead of
 * a walk down the profile (a million cells in well under a second). The answer is the same
 * linear interpolation as `firstCrossingM`; profiles it cannot handle so (a surface at or above
 * the isotherm, or a negative g) take that walk.
 */
function isothermDepthFunction(a: GeothermProfile, b: GeothermProfile, isothermC: number) {
	const n = a.depthM.length;
	const z = a.depthM;
	const ta = Float64Array.from(a.temperatureC);
	const g = Float64Array.from(ta, (t, k) => (b.temperatureC[k] - t) / (Q_B - Q_A));
	const t = new Float64Array(n);
	const walk = (q: number) => {
		for (let k = 0; k < n; k++) t[k] = ta[k] + (q - Q_A) * g[k];
		return firstCrossingM(z, t, isothermC) ?? NaN;
	};
	if (ta[0] >= isothermC || g.some((v) => v < 0))
		return (q: number) => (Number.isFinite(q) ? walk(q) : NaN);
	const runMin = new Float64Array(n);
	let m = Infinity;
	for (let k = 0; k < n; k++) {
		const qk =
			g[k] > 0 ? Q_A + (isothermC - ta[k]) / g[k] : ta[k] >= isothermC ? -Infinity : Infinity;
		m = Math.min(m, qk);
		runMin[k] = m;
	}
	const at = (k: number, q: number) => ta[k] + (q - Q_A) * g[k] - isothermC;
	return (q: number) => {
		if (!Number.isFinite(q) || runMin[n - 1] > q) {
			// Not reached by the search; rounding at the last step is settled by the walk.
			return Number.isFinite(q) && at(n - 1, q) >= 0 ? walk(q) : NaN;
		}
		let lo = 0;
		let hi = n - 1;
		while (lo < hi) {
			const mid = (lo + hi) >> 1;
			if (runMin[mid] <= q) hi = mid;
			else lo = mid + 1;
		}
		// qk and the temperature may disagree by a rounding at the boundary: settle on the first k
		// whose temperature is at or above the isotherm, as the walk would.
		let k = lo;
		while (k > 0 && at(k - 1, q) >= 0) k--;
		while (k < n - 1 && at(k, q) < 0) k++;
		const cur = at(k, q);
		if (cur < 0) return NaN;
		if (k === 0 || cur === 0) return z[k];
		const prev = at(k - 1, q);
		return z[k - 1] + ((z[k] - z[k - 1]) * prev) / (prev - cur);
	};
}

/** Per cell: depth (m) of the isotherm, NaN where not reached within the crust or no heat flow. */
export function isothermDepthGrid(
	value: Float32Array,
	sigma: Float32Array | null,
	isothermC = DEFAULT_ISOTHERM_C,
	crust: AtDepthCrust = DEFAULT_CRUST
): Percentiles {
	const [a, b] = references(crust);
	const depthAt = isothermDepthFunction(a, b, isothermC);
	const out = {
		p10: new Float32Array(value.length),
		p50: new Float32Array(value.length),
		p90: new Float32Array(value.length)
	};
	for (let c = 0; c < value.length; c++) {
		const q = value[c];
		const s = sigma ? sigma[c] : NaN;
		out.p50[c] = depthAt(q);
		// Hotter (q + zσ) means shallower: the 10th percentile of depth.
		out.p10[c] = depthAt(q + NORMAL_Z90 * s);
		out.p90[c] = depthAt(q - NORMAL_Z90 * s);
	}
	return out;
}

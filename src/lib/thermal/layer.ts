// Closed-form steady conduction inside one layer, in SI units (W/m², W/m³, m, °C).
// Heat flow: dq/dz = −A(z) (Turcotte & Schubert, Geodynamics, ch. 4). With k(T) = k0/(1 + bT) the
// Kirchhoff variable U = ln(1 + bT)/b obeys k0 dU/dz = q, i.e. the constant-k0 equation
// (Carslaw & Jaeger; applied to crust by Chapman 1986), so every layer is solved in U and mapped back.
// `decayM` is Infinity for uniform heat production; `b` is 0 for constant conductivity.

import { wm2ToMWm2 } from '../geo/units';

// A local binding: the bulk loop below calls functions of this module only (see evaluateLayerRange).
const toMWm2 = wm2ToMWm2;

/** x + expm1(−x) = x²/2 − x³/6 + …, without cancellation for small x (needed as decay → ∞). */
function excessOverLinear(x: number): number {
	if (x < 0.1) {
		// Alternating Taylor series; 10 terms leave < 1e-17 relative error for x < 0.1.
		let term = (x * x) / 2;
		let sum = term;
		for (let n = 3; n <= 12; n++) {
			term *= -x / n;
			sum += term;
		}
		return sum;
	}
	return x + Math.expm1(-x);
}

/** Heat flow (W/m², up positive) at distance sM below the layer top. */
export function heatFlowInLayerWm2(qTopWm2: number, aTopWm3: number, decayM: number, sM: number) {
	if (decayM === Infinity) return qTopWm2 - aTopWm3 * sM;
	// Lachenbruch (1970): q(s) = q_top − A_top h (1 − e^(−s/h)).
	return qTopWm2 + aTopWm3 * decayM * Math.expm1(-sM / decayM);
}

/** ∫₀ˢ A ds (W/m²): heat generated between the layer top and sM below it. */
export function integratedHeatProductionWm2(aTopWm3: number, decayM: number, sM: number): number {
	if (decayM === Infinity) return aTopWm3 * sM;
	return -aTopWm3 * decayM * Math.expm1(-sM / decayM);
}

/** Kirchhoff variable U (°C) at sM below the top: U_top + (q_top s − ∫₀ˢ∫₀^s' A) / k0. */
export function kirchhoffInLayerC(
	uTopC: number,
	qTopWm2: number,
	aTopWm3: number,
	decayM: number,
	k0WmK: number,
	sM: number
): number {
	const doubleIntegral =
		decayM === Infinity
			? (aTopWm3 * sM * sM) / 2
			: aTopWm3 * decayM * decayM * excessOverLinear(sM / decayM);
	return uTopC + (qTopWm2 * sM - doubleIntegral) / k0WmK;
}

/** Temperature (°C) → Kirchhoff variable U (°C) for k = k0/(1 + bT); U = T when b = 0. */
export function toKirchhoffC(temperatureC: number, b: number): number {
	const x = b * temperatureC;
	// For |bT| < 1e-8 use ln(1 + x)/b ≈ T(1 − x/2): exact to ~1e-16 and safe when b is denormal.
	if (Math.abs(x) < 1e-8) return temperatureC * (1 - x / 2);
	return Math.log1p(x) / b;
}

/** Kirchhoff variable U (°C) → temperature (°C): T = (e^(bU) − 1)/b. */
export function fromKirchhoffC(uC: number, b: number): number {
	const x = b * uC;
	if (Math.abs(x) < 1e-8) return uC * (1 + x / 2); // series, as in toKirchhoffC
	return Math.expm1(x) / b;
}

/** Conductivity (W/m/K) at temperature T for k = k0/(1 + bT). */
export function conductivityAtTemperatureWmK(k0WmK: number, b: number, temperatureC: number) {
	return k0WmK / (1 + b * temperatureC);
}

/** The constants of one layer that the closed forms need (SI; decayM Infinity = uniform, b 0 = constant k). */
export interface LayerConstants {
	topM: number;
	qTopWm2: number;
	aTopWm3: number;
	decayM: number;
	k0WmK: number;
	uTopC: number;
	b: number;
}

/**
 * Writes T (°C) and q (mW/m²) at depthM[from..to) inside one layer into the output arrays: the
 * closed forms above, with the layer constants hoisted, because profiles are solved in bulk. It
 * lives here so the hot loop calls functions of its own module only (cheap in every bundler).
 */
export function evaluateLayerRange(
	layer: LayerConstants,
	depthM: readonly number[],
	from: number,
	to: number,
	temperatureC: number[],
	heatFlowMWm2: number[]
): void {
	const { topM, qTopWm2: q0, aTopWm3: a, decayM: h, k0WmK, uTopC: u0, b } = layer;
	const invK = 1 / k0WmK;
	const uniform = h === Infinity || a === 0;
	for (let i = from; i < to; i++) {
		const s = depthM[i] - topM;
		let q: number;
		let u: number;
		if (uniform) {
			q = q0 - a * s;
			u = u0 + (q0 * s - 0.5 * a * s * s) * invK;
		} else {
			const x = s / h;
			const e = Math.expm1(-x); // shared by q and U
			q = q0 + a * h * e;
			u = u0 + (q0 * s - a * h * h * (x < 0.1 ? excessOverLinear(x) : x + e)) * invK;
		}
		temperatureC[i] = b === 0 ? u : fromKirchhoffC(u, b);
		heatFlowMWm2[i] = toMWm2(q);
	}
}

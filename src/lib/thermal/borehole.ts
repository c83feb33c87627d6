// Heat flow from a borehole temperature log (docs/science.md#borehole-heat-flow).
// Interval method: q = k̄ Γ, Γ the least-squares gradient, k̄ the thickness-weighted harmonic mean.
// Bullard method: T = T0 + q R(z) with R = ∫ dz/k; q is the least-squares slope of T on R
// (Bullard 1939, Proc. R. Soc. Lond. A 173).
// Uncertainty (first order, Taylor 1997 ch. 3; docs/science.md#uncertainty): σq/q = √((σΓ/Γ)² + (σk̄/k̄)²), written as
// σq = √((k̄ σΓ)² + (Γ σk̄)²) so Γ = 0 stays finite. σΓ is the slope's standard error; σk̄/k̄ = σR/R with
// σR² = Σ (hᵢ σᵢ / kᵢ²)² over the intervals (independent). For Bullard, the slope's own standard
// error takes the place of k̄ σΓ and the same σR/R is the conductivity term (a common shift of all R
// values scales the slope by R/(R + δR)).

import { InputError } from '../foundation/errors';
import {
	rangeResistance,
	requireCoverage,
	sortedIntervals,
	thermalResistanceM2KW,
	type ConductivityInterval
} from './intervals';
import { linearFit } from './regression';
import {
	requireAllFinite,
	requireFinite,
	requireIncreasing,
	requireSameLength
} from '../foundation/validate';
import { kPerKmToKPerM, kPerMToKPerKm, wm2ToMWm2 } from '../geo/units';

export interface HeatFlowFromLogInput {
	depthM: number[]; // a temperature log, depths increasing
	temperatureC: number[];
	conductivity: ConductivityInterval[]; // covering the fitted depth range
	method: 'interval' | 'bullard';
	fromM?: number; // fitted range: points with fromM <= depth <= toM; default the whole log
	toM?: number;
}

export interface HeatFlowEstimate {
	heatFlowMWm2: number;
	sigmaMWm2: number;
	gradientKPerKm: number;
	sigmaGradientKPerKm: number;
	meanConductivityWmK: number; // thickness-weighted harmonic mean over the range
	sigmaMeanConductivityWmK: number; // k̄ σR/R: what the samples' σ give the mean (0 without σ)
	interceptC: number; // fitted temperature at the top of the range (or at R = 0)
	samples: number; // log points used in the fit
}

/** A temperature log cut to a fitted range: the index window [first, last] of the points used. */
export interface LogWindow {
	first: number;
	last: number;
	topM: number;
	bottomM: number;
}

/** Validates a log and finds the points with fromM <= depth <= toM (at least 3). */
export function logWindow(
	depthM: readonly number[],
	temperatureC: readonly number[],
	fromM?: number,
	toM?: number
): LogWindow {
	if (!Array.isArray(depthM)) throw new InputError('depthM', depthM, 'must be an array');
	if (!Array.isArray(temperatureC))
		throw new InputError('temperatureC', temperatureC, 'must be an array');
	requireSameLength('temperatureC', depthM, temperatureC);
	requireIncreasing('depthM', depthM);
	requireAllFinite('temperatureC', temperatureC);
	const from = fromM ?? -Infinity;
	const to = toM ?? Infinity;
	if (fromM != null) requireFinite('fromM', fromM);
	if (toM != null) requireFinite('toM', toM);
	let first = 0;
	while (first < depthM.length && depthM[first] < from) first++;
	let last = depthM.length - 1;
	while (last >= 0 && depthM[last] > to) last--;
	const samples = last - first + 1;
	if (samples < 3) {
		throw new InputError(
			fromM != null || toM != null ? 'fromM/toM' : 'depthM',
			[fromM ?? null, toM ?? null],
			`must select at least 3 log points for a fit; the range holds ${Math.max(0, samples)}`
		);
	}
	return { first, last, topM: depthM[first], bottomM: depthM[last] };
}

/** Least-squares temperature gradient (K/km) with standard error over [fromM, toM]. */
export function temperatureGradient(input: {
	depthM: number[];
	temperatureC: number[];
	fromM?: number;
	toM?: number;
}): { gradientKPerKm: number; sigmaGradientKPerKm: number; interceptC: number; samples: number } {
	const w = logWindow(input.depthM, input.temperatureC, input.fromM, input.toM);
	// Fit against depth below the range top so the intercept is the temperature there.
	const x = input.depthM.slice(w.first, w.last + 1).map((z) => z - w.topM);
	const fit = linearFit(x, input.temperatureC.slice(w.first, w.last + 1));
	return {
		gradientKPerKm: kPerMToKPerKm(fit.slope),
		sigmaGradientKPerKm: kPerMToKPerKm(fit.sigmaSlope),
		interceptC: fit.intercept,
		samples: fit.samples
	};
}

/** Heat flow (mW/m², up positive) from a temperature log and conductivities, interval or Bullard method. */
export function heatFlowFromLog(input: HeatFlowFromLogInput): HeatFlowEstimate {
	if (input.method !== 'interval' && input.method !== 'bullard') {
		throw new InputError('method', input.method, "must be 'interval' or 'bullard'");
	}
	const w = logWindow(input.depthM, input.temperatureC, input.fromM, input.toM);
	const intervals = sortedIntervals(input.conductivity);
	requireCoverage(intervals, w.topM, w.bottomM);
	const { resistanceM2KW, sigmaResistanceM2KW } = rangeResistance(intervals, w.topM, w.bottomM);
	const meanK = (w.bottomM - w.topM) / resistanceM2KW;
	const relSigmaK = sigmaResistanceM2KW / resistanceM2KW; // σk̄/k̄ = σR/R
	const gradient = temperatureGradient(input);
	const gammaKPerM = kPerKmToKPerM(gradient.gradientKPerKm);
	const sigmaGammaKPerM = kPerKmToKPerM(gradient.sigmaGradientKPerKm);

	let qWm2: number;
	let sigmaWm2: number;
	let interceptC: number;
	if (input.method === 'interval') {
		qWm2 = meanK * gammaKPerM;
		sigmaWm2 = Math.hypot(meanK * sigmaGammaKPerM, gammaKPerM * meanK * relSigmaK);
		interceptC = gradient.interceptC;
	} else {
		const depths = input.depthM.slice(w.first, w.last + 1);
		const r = thermalResistanceM2KW(intervals, depths, w.topM);
		const fit = linearFit(r, input.temperatureC.slice(w.first, w.last + 1));
		qWm2 = fit.slope;
		sigmaWm2 = Math.hypot(fit.sigmaSlope, fit.slope * relSigmaK);
		interceptC = fit.intercept;
	}
	return {
		heatFlowMWm2: wm2ToMWm2(qWm2),
		sigmaMWm2: wm2ToMWm2(sigmaWm2),
		gradientKPerKm: gradient.gradientKPerKm,
		sigmaGradientKPerKm: gradient.sigmaGradientKPerKm,
		meanConductivityWmK: meanK,
		sigmaMeanConductivityWmK: meanK * relSigmaK,
		interceptC,
		samples: w.last - w.first + 1
	};
}

/** Bullard plot data: thermal resistance from the range top (m²K/W) against temperature (°C). */
export function bullardPlot(input: Omit<HeatFlowFromLogInput, 'method'>): {
	thermalResistanceM2KW: number[];
	temperatureC: number[];
	depthM: number[];
} {
	const w = logWindow(input.depthM, input.temperatureC, input.fromM, input.toM);
	const intervals = sortedIntervals(input.conductivity);
	requireCoverage(intervals, w.topM, w.bottomM);
	const depthM = input.depthM.slice(w.first, w.last + 1);
	return {
		thermalResistanceM2KW: Array.from(thermalResistanceM2KW(intervals, depthM, w.topM)),
		temperatureC: input.temperatureC.slice(w.first, w.last + 1),
		depthM
	};
}

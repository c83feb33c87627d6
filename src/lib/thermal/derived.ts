// Quantities read off a sampled geotherm. Between samples the profile is taken as linear, which is
// what a chart shows; refine depthStepM when that matters.

import { InputError } from '../foundation/errors';
import { linearFit } from './regression';
import type { GeothermProfile } from './types';
import { requireFinite } from '../foundation/validate';
import { kPerKmToKPerM, mWm2PerUWm3ToM } from '../geo/units';

/** Brittle–ductile transition in quartz-rich crust, °C (common practice, no source). */
export const BRITTLE_DUCTILE_QUARTZ_C = 300;

/** Default mantle potential temperature, °C (about 1300–1350: common practice, from memory). */
export const DEFAULT_POTENTIAL_TEMPERATURE_C = 1330;

/** Default adiabatic gradient, K/km (about 0.3–0.5: common practice, from memory). */
export const DEFAULT_ADIABAT_GRADIENT_K_PER_KM = 0.4;

/** Index i with depth[i] <= z <= depth[i + 1]; throws outside the profile. */
function bracket(profile: GeothermProfile, depthM: number): number {
	requireFinite('depthM', depthM);
	const d = profile.depthM;
	const last = d.length - 1;
	if (!(depthM >= d[0] && depthM <= d[last])) {
		throw new InputError('depthM', depthM, `must be within the profile, ${d[0]}…${d[last]} m`);
	}
	let lo = 0;
	let hi = last;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (d[mid] <= depthM) lo = mid;
		else hi = mid;
	}
	return Math.min(lo, Math.max(0, last - 1));
}

function interpolate(depth: number[], values: number[], i: number, z: number): number {
	if (depth.length === 1) return values[0];
	const w = (z - depth[i]) / (depth[i + 1] - depth[i]);
	return values[i] + w * (values[i + 1] - values[i]);
}

/** Temperature (°C) at depthM (m), linear between samples; throws outside the profile. */
export function temperatureAtDepthC(profile: GeothermProfile, depthM: number): number {
	const i = bracket(profile, depthM);
	return interpolate(profile.depthM, profile.temperatureC, i, depthM);
}

/** Heat flow (mW/m², up positive) at depthM (m), linear between samples. */
export function heatFlowAtDepthMWm2(profile: GeothermProfile, depthM: number): number {
	const i = bracket(profile, depthM);
	return interpolate(profile.depthM, profile.heatFlowMWm2, i, depthM);
}

/** Depth (m) where `values − target` first reaches zero, linear between samples; null if never. */
export function firstCrossingM(
	depth: ArrayLike<number>,
	values: ArrayLike<number>,
	target: number
) {
	let prev = values[0] - target;
	if (prev === 0) return depth[0];
	for (let i = 1; i < depth.length; i++) {
		const cur = values[i] - target;
		if (cur === 0) return depth[i];
		if (prev < 0 !== cur < 0) {
			return depth[i - 1] + ((depth[i] - depth[i - 1]) * prev) / (prev - cur);
		}
		prev = cur;
	}
	return null;
}

/** Depth (m) of the first crossing of an isotherm (°C) going down; null if the profile never reaches it. */
export function isothermDepthM(profile: GeothermProfile, temperatureC: number): number | null {
	requireFinite('temperatureC', temperatureC);
	return firstCrossingM(profile.depthM, profile.temperatureC, temperatureC);
}

/** Depth (m) of the 300 °C isotherm, the usual brittle–ductile proxy for quartz-rich crust. */
export function brittleDuctileDepthM(
	profile: GeothermProfile,
	temperatureC = BRITTLE_DUCTILE_QUARTZ_C
) {
	return isothermDepthM(profile, temperatureC);
}

/** Moho temperature (°C): at mohoDepthM, default the base of the profile. */
export function mohoTemperatureC(profile: GeothermProfile, mohoDepthM?: number): number {
	return temperatureAtDepthC(profile, mohoDepthM ?? profile.depthM[profile.depthM.length - 1]);
}

/** Surface heat flow split into the part produced above a depth and the part coming from below (mW/m²). */
export interface HeatFlowSplit {
	surfaceHeatFlowMWm2: number;
	/**
	 * Heat flow entering from below the depth: the mantle (basal) heat flow when that depth is the
	 * Moho. Not the "reduced heat flow" of the trade, which is the intercept of the heat-flow /
	 * heat-production relation (heatFlowProvinceFit).
	 */
	heatFlowBelowMWm2: number;
	/** Heat produced between the surface and the depth. */
	producedHeatFlowMWm2: number;
	/** producedHeatFlowMWm2 / surfaceHeatFlowMWm2 (NaN when the surface heat flow is 0). */
	producedFraction: number;
	depthM: number;
}

/** Splits surface heat flow into heat produced above depthM (default the base) and heat flow from below it. */
export function heatFlowSplit(profile: GeothermProfile, depthM?: number): HeatFlowSplit {
	const z = depthM ?? profile.depthM[profile.depthM.length - 1];
	const below = depthM == null ? profile.basalHeatFlowMWm2 : heatFlowAtDepthMWm2(profile, z);
	const produced = profile.surfaceHeatFlowMWm2 - below;
	return {
		surfaceHeatFlowMWm2: profile.surfaceHeatFlowMWm2,
		heatFlowBelowMWm2: below,
		producedHeatFlowMWm2: produced,
		producedFraction:
			profile.surfaceHeatFlowMWm2 === 0 ? NaN : produced / profile.surfaceHeatFlowMWm2,
		depthM: z
	};
}

/** Mantle adiabat T = Tp + gradient·z used to define the base of the thermal lithosphere. */
export interface AdiabatOptions {
	potentialTemperatureC?: number; // default 1330 °C
	gradientKPerKm?: number; // default 0.4 K/km
}

/** Where the geotherm first meets the adiabat: the thermal lithosphere base (m, °C), null if not reached. */
export function lithosphereBase(
	profile: GeothermProfile,
	options: AdiabatOptions = {}
): { depthM: number; temperatureC: number } | null {
	const tp = options.potentialTemperatureC ?? DEFAULT_POTENTIAL_TEMPERATURE_C;
	const g = kPerKmToKPerM(options.gradientKPerKm ?? DEFAULT_ADIABAT_GRADIENT_K_PER_KM);
	requireFinite('potentialTemperatureC', tp);
	requireFinite('gradientKPerKm', g);
	const excess = profile.temperatureC.map((t, i) => t - (tp + g * profile.depthM[i]));
	const depthM = firstCrossingM(profile.depthM, excess, 0);
	return depthM == null ? null : { depthM, temperatureC: tp + g * depthM };
}

/** Linear heat-flow / heat-production fit q0 = qr + D·A0 over sites in one province. */
export interface HeatFlowProvinceFit {
	/** The intercept qr: heat flow from below the radiogenic upper layer (the trade's "reduced heat flow"). */
	reducedHeatFlowMWm2: number;
	sigmaReducedHeatFlowMWm2: number;
	characteristicDepthM: number;
	sigmaCharacteristicDepthM: number;
	samples: number;
}

/**
 * Reduced heat flow and characteristic depth D from surface heat flow (mW/m²) against surface heat
 * production (µW/m³) at several sites: the linear relation behind the exponential model of
 * Lachenbruch (1970) (q0 = qr + D·A0).
 */
export function heatFlowProvinceFit(
	sites: { heatFlowMWm2: number; heatProductionUWm3: number }[]
): HeatFlowProvinceFit {
	if (!Array.isArray(sites) || sites.length < 3) {
		throw new InputError('sites', sites?.length, 'must hold at least 3 sites');
	}
	const a = sites.map(
		(s, i) => (
			requireFinite(`sites[${i}].heatProductionUWm3`, s.heatProductionUWm3),
			s.heatProductionUWm3
		)
	);
	const q = sites.map(
		(s, i) => (requireFinite(`sites[${i}].heatFlowMWm2`, s.heatFlowMWm2), s.heatFlowMWm2)
	);
	const fit = linearFit(a, q);
	return {
		reducedHeatFlowMWm2: fit.intercept,
		sigmaReducedHeatFlowMWm2: fit.sigmaIntercept,
		characteristicDepthM: mWm2PerUWm3ToM(fit.slope),
		sigmaCharacteristicDepthM: mWm2PerUWm3ToM(fit.sigmaSlope),
		samples: fit.samples
	};
}

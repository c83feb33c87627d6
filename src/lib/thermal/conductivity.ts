// Mean conductivities and mixing laws (common practice, no source, unless noted).

import { InputError } from '../foundation/errors';
import { requireInRange, requirePositive } from '../foundation/validate';

/** Thermal conductivity of water near 20 °C, W/m/K (handbook value, from memory). */
export const WATER_CONDUCTIVITY_20C_WMK = 0.6;

function checkWeighted(values: readonly number[], weights: readonly number[] | undefined): void {
	if (values.length === 0) throw new InputError('conductivityWmK', values, 'must not be empty');
	if (weights && weights.length !== values.length) {
		throw new InputError(
			'weights',
			weights.length,
			`must have one weight per value (${values.length})`
		);
	}
	values.forEach((k, i) => requirePositive(`conductivityWmK[${i}]`, k));
	weights?.forEach((w, i) => requirePositive(`weights[${i}]`, w));
}

/** Weighted harmonic mean (W/m/K): the effective k of layers in series (weights = thicknesses). */
export function harmonicMeanWmK(
	conductivityWmK: readonly number[],
	weights?: readonly number[]
): number {
	checkWeighted(conductivityWmK, weights);
	let w = 0;
	let r = 0;
	conductivityWmK.forEach((k, i) => {
		const wi = weights ? weights[i] : 1;
		w += wi;
		r += wi / k;
	});
	return w / r;
}

/** Weighted arithmetic mean (W/m/K): the effective k of layers side by side (heat flowing along them). */
export function arithmeticMeanWmK(
	conductivityWmK: readonly number[],
	weights?: readonly number[]
): number {
	checkWeighted(conductivityWmK, weights);
	let w = 0;
	let s = 0;
	conductivityWmK.forEach((k, i) => {
		const wi = weights ? weights[i] : 1;
		w += wi;
		s += wi * k;
	});
	return s / w;
}

/** Weighted geometric mean (W/m/K): between the two bounds above; used for random mixtures. */
export function geometricMeanWmK(
	conductivityWmK: readonly number[],
	weights?: readonly number[]
): number {
	checkWeighted(conductivityWmK, weights);
	let w = 0;
	let s = 0;
	conductivityWmK.forEach((k, i) => {
		const wi = weights ? weights[i] : 1;
		w += wi;
		s += wi * Math.log(k);
	});
	return Math.exp(s / w);
}

/** Bulk conductivity (W/m/K) of a saturated porous rock: k = k_m^(1−φ) k_f^φ (geometric mixing). */
export function porousRockConductivityWmK(
	matrixConductivityWmK: number,
	porosity: number,
	fluidConductivityWmK = WATER_CONDUCTIVITY_20C_WMK
): number {
	requirePositive('matrixConductivityWmK', matrixConductivityWmK);
	requirePositive('fluidConductivityWmK', fluidConductivityWmK);
	requireInRange('porosity', porosity, 0, 1);
	return matrixConductivityWmK ** (1 - porosity) * fluidConductivityWmK ** porosity;
}

/** Matrix conductivity (W/m/K) from a bulk value by inverting the geometric mixing law. */
export function matrixConductivityWmK(
	bulkConductivityWmK: number,
	porosity: number,
	fluidConductivityWmK = WATER_CONDUCTIVITY_20C_WMK
): number {
	requirePositive('bulkConductivityWmK', bulkConductivityWmK);
	requirePositive('fluidConductivityWmK', fluidConductivityWmK);
	requireInRange('porosity', porosity, 0, 0.999999);
	return (bulkConductivityWmK / fluidConductivityWmK ** porosity) ** (1 / (1 - porosity));
}

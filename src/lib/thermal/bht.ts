// Bottom-hole temperature (BHT) correction by the Horner plot: after circulation for tc, the
// temperature at shut-in time Δt follows T(Δt) = T∞ − m ln((tc + Δt)/Δt) (Horner 1951; applied to
// BHTs by Dowdle & Cobb 1975). T∞, the formation temperature, is the intercept of T against the
// Horner log-time x = ln((tc + Δt)/Δt) at x = 0 (infinite shut-in). Any time unit works: only the
// ratio enters; hours are used in the names.

import { InputError } from '../foundation/errors';
import { linearFit } from './regression';
import { requireFinite, requirePositive } from '../foundation/validate';

/** One BHT reading of a logging run. */
export interface BhtReading {
	temperatureC: number;
	shutInTimeH: number; // Δt, time since circulation stopped
	circulationTimeH?: number; // tc for this reading; defaults to the run's value
}

export interface HornerEstimate {
	formationTemperatureC: number; // T∞
	/** Standard error of T∞ (°C); null with only 2 readings (the line passes through both). */
	sigmaFormationTemperatureC: number | null;
	slopeC: number; // m, °C per unit of ln-time; positive when the well warms up after circulation
	samples: number;
	warnings: string[];
}

/** Horner-plot static formation temperature (°C) from ≥ 2 BHTs, with its standard error from ≥ 3. */
export function hornerFormationTemperature(
	readings: BhtReading[],
	circulationTimeH?: number
): HornerEstimate {
	if (!Array.isArray(readings) || readings.length < 2) {
		throw new InputError(
			'readings',
			readings?.length,
			'must hold at least 2 bottom-hole temperatures'
		);
	}
	if (circulationTimeH != null) requirePositive('circulationTimeH', circulationTimeH);
	const x: number[] = [];
	const t: number[] = [];
	readings.forEach((r, i) => {
		requireFinite(`readings[${i}].temperatureC`, r.temperatureC);
		requirePositive(`readings[${i}].shutInTimeH`, r.shutInTimeH);
		const tc = r.circulationTimeH ?? circulationTimeH;
		if (tc == null) {
			throw new InputError(
				`readings[${i}].circulationTimeH`,
				tc,
				'must be given (or a run-wide circulationTimeH)'
			);
		}
		requirePositive(`readings[${i}].circulationTimeH`, tc);
		x.push(Math.log((tc + r.shutInTimeH) / r.shutInTimeH));
		t.push(r.temperatureC);
	});
	const distinct = new Set(x).size;
	if (distinct < 2) {
		throw new InputError(
			'readings',
			readings.length,
			'must include at least 2 different Horner times (shut-in / circulation)'
		);
	}
	const fit = linearFit(x, t);
	const slopeC = -fit.slope;
	const warnings: string[] = [];
	if (slopeC < 0)
		warnings.push('BHTs fall with shut-in time: the Horner model expects the well to warm up');
	return {
		formationTemperatureC: fit.intercept,
		sigmaFormationTemperatureC: fit.samples >= 3 ? fit.sigmaIntercept : null,
		slopeC,
		samples: fit.samples,
		warnings
	};
}

// Conductivity intervals measured along a borehole: validation, coverage, thermal resistance.

import { InputError } from '../foundation/errors';
import { requireFinite, requireNonNegative, requirePositive } from '../foundation/validate';

/** A depth interval (m) with its measured conductivity (W/m/K) and optional standard deviation. */
export interface ConductivityInterval {
	topM: number;
	bottomM: number;
	conductivityWmK: number;
	sigmaWmK?: number;
}

// Intervals may touch with this much slack (m) without counting as a gap or an overlap.
const TOUCH_M = 1e-6;

/** Validates intervals and returns them sorted by top; throws on overlaps. */
export function sortedIntervals(
	intervals: readonly ConductivityInterval[]
): ConductivityInterval[] {
	if (!Array.isArray(intervals) || intervals.length === 0) {
		throw new InputError('conductivity', intervals, 'must be a non-empty array of intervals');
	}
	intervals.forEach((c, i) => {
		requireFinite(`conductivity[${i}].topM`, c.topM);
		requireFinite(`conductivity[${i}].bottomM`, c.bottomM);
		if (!(c.bottomM > c.topM)) {
			throw new InputError(
				`conductivity[${i}].bottomM`,
				c.bottomM,
				`must be greater than topM (${c.topM})`
			);
		}
		requirePositive(`conductivity[${i}].conductivityWmK`, c.conductivityWmK);
		if (c.sigmaWmK != null) requireNonNegative(`conductivity[${i}].sigmaWmK`, c.sigmaWmK);
	});
	const sorted = [...intervals].sort((a, b) => a.topM - b.topM);
	for (let i = 1; i < sorted.length; i++) {
		if (sorted[i].topM < sorted[i - 1].bottomM - TOUCH_M) {
			throw new InputError(
				'conductivity',
				[sorted[i - 1].topM, sorted[i - 1].bottomM, sorted[i].topM],
				`intervals overlap: one ends at ${sorted[i - 1].bottomM} m, the next starts at ${sorted[i].topM} m`
			);
		}
	}
	return sorted;
}

/** Throws unless sorted intervals cover [topM, bottomM] without gaps. */
export function requireCoverage(
	sorted: readonly ConductivityInterval[],
	topM: number,
	bottomM: number
): void {
	let reached = topM;
	for (const c of sorted) {
		if (c.bottomM <= reached) continue;
		if (c.topM > reached + TOUCH_M) break;
		reached = c.bottomM;
		if (reached >= bottomM - TOUCH_M) return;
	}
	if (reached < bottomM - TOUCH_M) {
		throw new InputError(
			'conductivity',
			[topM, bottomM],
			`must cover the fitted range ${topM}…${bottomM} m; nothing covers ${reached} m and below it`
		);
	}
}

/** Thermal resistance ∫ dz/k (m²K/W) and its first-order σ from [topM, bottomM] on covering intervals. */
export function rangeResistance(
	sorted: readonly ConductivityInterval[],
	topM: number,
	bottomM: number
) {
	let r = 0;
	let var_ = 0;
	for (const c of sorted) {
		const h = Math.min(c.bottomM, bottomM) - Math.max(c.topM, topM);
		if (h <= 0) continue;
		r += h / c.conductivityWmK;
		// ∂R/∂k = −h/k², intervals independent.
		const s = c.sigmaWmK ?? 0;
		var_ += ((h * s) / (c.conductivityWmK * c.conductivityWmK)) ** 2;
	}
	return { resistanceM2KW: r, sigmaResistanceM2KW: Math.sqrt(var_) };
}

/** Thermal resistance R(z) = ∫_origin^z dz/k (m²K/W) at increasing depths ≥ originM (Bullard 1939). */
export function thermalResistanceM2KW(
	sorted: readonly ConductivityInterval[],
	depthM: ArrayLike<number>,
	originM: number
): Float64Array {
	const out = new Float64Array(depthM.length);
	let j = 0;
	let rAtTop = 0; // resistance from originM to the top of interval j (or to originM)
	for (let i = 0; i < depthM.length; i++) {
		const z = depthM[i];
		while (j < sorted.length && sorted[j].bottomM < z) {
			const c = sorted[j];
			const h = c.bottomM - Math.max(c.topM, originM);
			if (h > 0) rAtTop += h / c.conductivityWmK;
			j++;
		}
		const c = sorted[j];
		const h = c ? z - Math.max(c.topM, originM) : 0;
		out[i] = rAtTop + (h > 0 ? h / c.conductivityWmK : 0);
	}
	return out;
}

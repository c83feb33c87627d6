import { InputError } from '../foundation/errors';

/** Two output depths closer than this (m), or than this fraction of the step, are one sample. */
const SAME_DEPTH_M = 1e-6;
const SAME_DEPTH_STEP_FRACTION = 1e-3;

/** Above this many samples a profile is almost certainly a unit mistake (e.g. step in km). */
export const MAX_PROFILE_SAMPLES = 5_000_000;

/**
 * Output depths (m): every multiple of the step from 0 to the base, every layer boundary and the
 * base, increasing, without duplicates. Two depths closer than 1 µm (or a thousandth of the step)
 * are one sample, which absorbs i·step rounding (3 × 0.1 m); the boundary's exact value wins.
 */
export function sampleDepthsM(layerBaseDepthsM: readonly number[], depthStepM: number): number[] {
	// Bulk callers (benchmarks, sweeps, Monte Carlo) ask for the same grid again and again; a
	// one-entry cache turns that into a copy.
	if (depthStepM === cache.step && sameDepths(layerBaseDepthsM, cache.bases))
		return cache.depths.slice();
	const depths = computeDepths(layerBaseDepthsM, depthStepM);
	cache = { step: depthStepM, bases: layerBaseDepthsM.slice(), depths: depths.slice() };
	return depths;
}

let cache: { step: number; bases: number[]; depths: number[] } = {
	step: NaN,
	bases: [],
	depths: []
};

function sameDepths(a: readonly number[], b: readonly number[]): boolean {
	if (a.length !== b.length) return false;
	for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
	return true;
}

function computeDepths(layerBaseDepthsM: readonly number[], depthStepM: number): number[] {
	const baseM = layerBaseDepthsM[layerBaseDepthsM.length - 1];
	const count = Math.floor(baseM / depthStepM + 1e-9);
	if (count + layerBaseDepthsM.length > MAX_PROFILE_SAMPLES) {
		throw new InputError(
			'depthStepM',
			depthStepM,
			`gives more than ${MAX_PROFILE_SAMPLES} samples for a ${baseM} m profile`
		);
	}
	const same = Math.min(SAME_DEPTH_M, depthStepM * SAME_DEPTH_STEP_FRACTION);
	const depths: number[] = [0];
	let i = 1; // next multiple
	let j = 0; // next boundary
	while (j < layerBaseDepthsM.length) {
		const multiple = i * depthStepM;
		const boundary = layerBaseDepthsM[j];
		// Merge the two increasing lists by value so the output is monotone whatever the rounding.
		const takeBoundary = i > count || boundary <= multiple;
		const depth = takeBoundary ? boundary : multiple;
		if (takeBoundary) j++;
		else i++;
		const last = depths[depths.length - 1];
		if (depth - last <= same) {
			if (takeBoundary) depths[depths.length - 1] = depth;
		} else {
			depths.push(depth);
		}
	}
	return depths;
}

// Monte Carlo temperature bands. Each sample redraws the boundary heat flow and every layer's
// conductivity and heat production, solves the geotherm in closed form (geotherm.ts) and is
// evaluated at the profile depths; bands are P10/P50/P90 per depth.
// P10 here is the 10th percentile (90 % of samples are hotter). Note that reserves reporting often
// uses the opposite convention (P90 = exceeded with 90 % probability); we follow the statistical one.
// Layer thicknesses, decay lengths and b are held fixed, so every sample shares the same depths.
// Speed: per-layer Float64Arrays of the state at each layer top, one pass per depth over all samples
// with the depth-only factors hoisted, the Kirchhoff variable instead of T inside the loop, and
// percentiles tracked from depth to depth (tracker.ts) instead of sorting every column.

import { drawTruncated, type Distribution } from './distributions';
import { InputError } from '../foundation/errors';
import { prepareGeotherm, type PreparedLayer } from './geotherm';
import {
	fromKirchhoffC,
	heatFlowInLayerWm2,
	integratedHeatProductionWm2,
	kirchhoffInLayerC,
	toKirchhoffC
} from './layer';
import { percentilesInPlace } from './percentile';
import { createRandom, type Random } from '../foundation/random';
import { PercentileTracker } from './tracker';
import { sampleDepthsM } from './sampling';
import type { GeothermInput } from './types';
import { MONTE_CARLO_SAMPLES, MONTE_CARLO_SEED, SOLVER_OUTPUT_STEP_M } from '../foundation/limits';
import { requireFinite, requireNonNegative, requirePositive } from '../foundation/validate';
import { mWm2ToWm2, uWm3ToWm3, wm2ToMWm2, wm3ToUWm3 } from '../geo/units';

/** Standard deviations of one layer's inputs; omitted = known exactly. */
export interface LayerUncertainty {
	conductivitySigmaWmK?: number;
	heatProductionSigmaUWm3?: number;
}

export interface MonteCarloInput {
	/** Central (mean) model; its boundary heat flow is the one perturbed. */
	model: GeothermInput;
	/** Standard deviation of the model's boundary heat flow (surface or basal, whichever is given). */
	heatFlowSigmaMWm2?: number;
	/** One entry per layer (or fewer; missing layers are exact). */
	layers?: LayerUncertainty[];
	/** Distribution of every uncertain input, default 'normal'; overridable per quantity. */
	distribution?: Distribution;
	heatFlowDistribution?: Distribution;
	conductivityDistribution?: Distribution;
	heatProductionDistribution?: Distribution;
	/** Bounds of the boundary heat flow draws (mW/m²), default [0, Infinity). */
	heatFlowBoundsMWm2?: [number, number];
	samples?: number; // default MONTE_CARLO_SAMPLES
	seed?: number; // default MONTE_CARLO_SEED
	isothermsC?: number[];
	/** Also return mean and standard deviation per depth (costs one exp per sample and depth). */
	moments?: boolean;
}

/** P10/P50/P90 of one scalar. */
export interface PercentileTriple {
	p10: number;
	p50: number;
	p90: number;
}

export interface IsothermPercentiles {
	temperatureC: number;
	/** Depth percentiles (m); null when that share of samples never reaches the isotherm in the profile. */
	p10M: number | null;
	p50M: number | null;
	p90M: number | null;
	fractionReached: number;
}

export interface MonteCarloBand {
	depthM: number[];
	p10C: number[];
	p50C: number[];
	p90C: number[];
	/** Mean and standard deviation (°C) per depth; only when `moments: true` was asked for. */
	meanC?: number[];
	sdC?: number[];
	surfaceHeatFlowMWm2: PercentileTriple;
	basalHeatFlowMWm2: PercentileTriple;
	isotherms: IsothermPercentiles[];
	samples: number;
	seed: number;
}

const P = [0.1, 0.5, 0.9];

/** Seeded Monte Carlo geotherm band: P10/P50/P90 temperature (°C) at the profile depths (m). */
export function monteCarloGeotherm(input: MonteCarloInput): MonteCarloBand {
	const central = prepareGeotherm(input.model); // validates the central model
	const n = input.samples ?? MONTE_CARLO_SAMPLES;
	if (!Number.isInteger(n) || n < 2 || n > 10_000_000) {
		throw new InputError('samples', n, 'must be an integer between 2 and 10,000,000');
	}
	const seed = input.seed ?? MONTE_CARLO_SEED;
	requireFinite('seed', seed);
	const step = input.model.depthStepM ?? SOLVER_OUTPUT_STEP_M;
	requirePositive('depthStepM', step);
	const sigmaQ = input.heatFlowSigmaMWm2 ?? 0;
	requireNonNegative('heatFlowSigmaMWm2', sigmaQ);
	const [qMin, qMax] = input.heatFlowBoundsMWm2 ?? [0, Infinity];
	const isotherms = input.isothermsC ?? [];
	isotherms.forEach((t, i) => requireFinite(`isothermsC[${i}]`, t));
	const uncertainties = input.layers ?? [];
	if (uncertainties.length > central.layers.length) {
		throw new InputError(
			'layers',
			uncertainties.length,
			`must not exceed the ${central.layers.length} model layers`
		);
	}
	uncertainties.forEach((u, i) => {
		if (u.conductivitySigmaWmK != null)
			requireNonNegative(`layers[${i}].conductivitySigmaWmK`, u.conductivitySigmaWmK);
		if (u.heatProductionSigmaUWm3 != null)
			requireNonNegative(`layers[${i}].heatProductionSigmaUWm3`, u.heatProductionSigmaUWm3);
	});
	const dist = input.distribution ?? 'normal';
	const qDist = input.heatFlowDistribution ?? dist;
	const kDist = input.conductivityDistribution ?? dist;
	const aDist = input.heatProductionDistribution ?? dist;

	const layers = central.layers;
	const L = layers.length;
	const basal = input.model.surfaceHeatFlowMWm2 == null;
	const qMean = (basal ? input.model.basalHeatFlowMWm2 : input.model.surfaceHeatFlowMWm2) as number;

	const { k0, aTop, qTop, uTop, q0, qb } = drawSamples(
		central.layers,
		central.surfaceTemperatureC,
		uncertainties,
		n,
		createRandom(seed),
		{ basal, qMean, sigmaQ, qMin, qMax, qDist, kDist, aDist }
	);
	// U(z) = uTop + (qTop/k0)·sM − (aTop/k0)·w(sM): keep the two ratios so the depth loop has no division.
	const qOverK = layers.map((_, j) => qTop[j].map((q, s) => q / k0[j][s]));
	const aOverK = layers.map((_, j) => aTop[j].map((a, s) => a / k0[j][s]));
	// Every result is a per-sample quantity or an order statistic, so the order in which samples
	// are stored is free. Storing them by their temperature at the base makes each depth's column
	// nearly sorted, which keeps the percentile scan's comparisons predictable for the CPU
	// (measured: a large share of the band's time was mispredicted branches on random order).
	const order = orderByBaseTemperature(uTop, qOverK, aOverK, layers);
	for (const arrays of [uTop, qOverK, aOverK]) {
		for (let j = 0; j < L; j++) arrays[j] = permute(arrays[j], order);
	}

	const depthM = sampleDepthsM(
		layers.map((l) => l.bottomM),
		step
	);
	const D = depthM.length;
	const p10C = new Float64Array(D);
	const p50C = new Float64Array(D);
	const p90C = new Float64Array(D);
	const moments = input.moments === true;
	const meanC = new Float64Array(moments ? D : 0);
	const sdC = new Float64Array(moments ? D : 0);
	// The column holds the Kirchhoff variable U of the current layer, not T: T(U) is increasing, so
	// ranks, percentiles and isotherm crossings can be found on U and only a handful of values
	// mapped back, which saves a transcendental per sample and depth.
	let column = new Float64Array(n);
	let previous = new Float64Array(n);
	const tracker = new PercentileTracker(n, P);
	const crossings = isotherms.map(() => new Float64Array(n).fill(Infinity));
	// Samples that have not crossed each isotherm yet; crossed ones are swapped out of the list.
	const pending = isotherms.map(() => Int32Array.from({ length: n }, (_, s) => s));
	const pendingCount = isotherms.map(() => n);
	let prevB = layers[0].b;
	let li = 0;
	// The per-sample work lives in small functions over typed arrays (fillColumn, scanIsotherm,
	// PercentileTracker.update): V8 optimises those once and keeps them, whereas loops inline in this long
	// function were deoptimised and re-entered by on-stack replacement again and again.
	for (let d = 0; d < D; d++) {
		const z = depthM[d];
		while (li < L - 1 && z > layers[li].bottomM) li++;
		const lay = layers[li];
		const b = lay.b;
		const sM = z - lay.topM;
		// U = uTop + (qTop·sM − aTop·w)/k0 with w the double integral of A/aTop (depth only).
		const w = kirchhoffInLayerC(0, 0, -1, lay.decayM, 1, sM);
		fillColumn(column, uTop[li], qOverK[li], aOverK[li], sM, w);

		for (let m = 0; m < isotherms.length; m++) {
			const target = isotherms[m];
			pendingCount[m] =
				d === 0
					? scanSurface(
							column,
							pending[m],
							pendingCount[m],
							crossings[m],
							kirchhoffTarget(target, b)
						)
					: scanIsotherm(
							column,
							previous,
							pending[m],
							pendingCount[m],
							crossings[m],
							target,
							b,
							prevB,
							depthM[d - 1],
							z
						);
		}

		if (d === 0) {
			p10C[0] = p50C[0] = p90C[0] = central.surfaceTemperatureC;
		} else {
			const [s10, s50, s90] = tracker.update(column);
			p10C[d] = bandValueC(s10, b);
			p50C[d] = bandValueC(s50, b);
			p90C[d] = bandValueC(s90, b);
		}
		if (moments) {
			const [mean, sd] =
				d === 0 ? constantMoments(central.surfaceTemperatureC, n) : momentsC(column, b);
			meanC[d] = mean;
			sdC[d] = sd;
		}
		[previous, column] = [column, previous];
		prevB = b;
	}

	return {
		depthM,
		p10C: Array.from(p10C),
		p50C: Array.from(p50C),
		p90C: Array.from(p90C),
		...(moments ? { meanC: Array.from(meanC), sdC: Array.from(sdC) } : {}),
		surfaceHeatFlowMWm2: triple(q0, wm2ToMWm2),
		basalHeatFlowMWm2: triple(qb, wm2ToMWm2),
		isotherms: isotherms.map((temperatureC, m) => {
			const cross = crossings[m];
			let reached = 0;
			for (let s = 0; s < n; s++) if (cross[s] !== Infinity) reached++;
			const [a, b, c] = percentilesInPlace(cross, P);
			const orNull = (v: number) => (Number.isFinite(v) ? v : null);
			return {
				temperatureC,
				p10M: orNull(a),
				p50M: orNull(b),
				p90M: orNull(c),
				fractionReached: reached / n
			};
		}),
		samples: n,
		seed
	};
}

interface DrawSettings {
	basal: boolean;
	qMean: number;
	sigmaQ: number;
	qMin: number;
	qMax: number;
	qDist: Distribution;
	kDist: Distribution;
	aDist: Distribution;
}

/**
 * Draws every sample's boundary heat flow, conductivities and heat productions (in that order per
 * sample, which fixes the results for a seed) and solves each for the state at every layer top.
 * Per-layer columns over samples: conductivity, top heat production, top heat flow, top U.
 */
function drawSamples(
	layers: PreparedLayer[],
	surfaceTemperatureC: number,
	uncertainties: LayerUncertainty[],
	n: number,
	random: Random,
	o: DrawSettings
) {
	const L = layers.length;
	const k0 = layers.map(() => new Float64Array(n));
	const aTop = layers.map(() => new Float64Array(n));
	const qTop = layers.map(() => new Float64Array(n));
	const uTop = layers.map(() => new Float64Array(n));
	const q0 = new Float64Array(n);
	const qb = new Float64Array(n);
	// Hoisted out of the sample loop: the names are only used in errors, and building them per draw
	// was a measurable share of the run.
	const kSigma = layers.map((_, j) => uncertainties[j]?.conductivitySigmaWmK ?? 0);
	const aSigma = layers.map((_, j) => uncertainties[j]?.heatProductionSigmaUWm3 ?? 0);
	const kField = layers.map((_, j) => `layers[${j}].conductivitySigmaWmK`);
	const aField = layers.map((_, j) => `layers[${j}].heatProductionSigmaUWm3`);
	for (let s = 0; s < n; s++) {
		const qDraw = mWm2ToWm2(
			drawTruncated(random, o.qDist, o.qMean, o.sigmaQ, o.qMin, o.qMax, 'heatFlowSigmaMWm2')
		);
		let production = 0;
		for (let j = 0; j < L; j++) {
			const lay = layers[j];
			k0[j][s] = drawTruncated(
				random,
				o.kDist,
				lay.k0WmK,
				kSigma[j],
				Number.MIN_VALUE,
				Infinity,
				kField[j]
			);
			// Drawn in µW/m³, the unit of the given standard deviation.
			aTop[j][s] = uWm3ToWm3(
				drawTruncated(random, o.aDist, wm3ToUWm3(lay.aTopWm3), aSigma[j], 0, Infinity, aField[j])
			);
			production += integratedHeatProductionWm2(aTop[j][s], lay.decayM, lay.bottomM - lay.topM);
		}
		let q = o.basal ? qDraw + production : qDraw;
		let t = surfaceTemperatureC;
		q0[s] = q;
		for (let j = 0; j < L; j++) {
			const lay = layers[j];
			const thickness = lay.bottomM - lay.topM;
			if (!(1 + lay.b * t > 0)) {
				throw new InputError(
					`layers[${j}].conductivityTempCoeffPerK`,
					lay.b,
					`makes 1 + b·T <= 0 in sample ${s}`
				);
			}
			qTop[j][s] = q;
			uTop[j][s] = toKirchhoffC(t, lay.b);
			const u = kirchhoffInLayerC(uTop[j][s], q, aTop[j][s], lay.decayM, k0[j][s], thickness);
			q = heatFlowInLayerWm2(q, aTop[j][s], lay.decayM, thickness);
			t = fromKirchhoffC(u, lay.b);
		}
		qb[s] = o.basal ? qDraw : q;
	}
	return { k0, aTop, qTop, uTop, q0, qb };
}

/** Sample indices sorted by each sample's Kirchhoff variable at the base of the last layer. */
function orderByBaseTemperature(
	uTop: Float64Array[],
	qOverK: Float64Array[],
	aOverK: Float64Array[],
	layers: PreparedLayer[]
): Uint32Array {
	const j = layers.length - 1;
	const lay = layers[j];
	const sM = lay.bottomM - lay.topM;
	const w = kirchhoffInLayerC(0, 0, -1, lay.decayM, 1, sM);
	const key = new Float64Array(uTop[j].length);
	fillColumn(key, uTop[j], qOverK[j], aOverK[j], sM, w);
	const order = Uint32Array.from({ length: key.length }, (_, s) => s);
	return order.sort((a, b) => key[a] - key[b]);
}

function permute(values: Float64Array, order: Uint32Array): Float64Array<ArrayBuffer> {
	const out = new Float64Array(values.length);
	for (let i = 0; i < order.length; i++) out[i] = values[order[i]];
	return out;
}

/** column[s] = U of every sample at one depth: uTop + (qTop/k0)·sM − (aTop/k0)·w. */
function fillColumn(
	column: Float64Array,
	uTopC: Float64Array,
	qOverK: Float64Array,
	aOverK: Float64Array,
	sM: number,
	w: number
): void {
	for (let s = 0; s < column.length; s++) column[s] = uTopC[s] + qOverK[s] * sM - aOverK[s] * w;
}

/** At the surface only samples exactly at the isotherm cross it (depth 0); returns the new count. */
function scanSurface(
	column: Float64Array,
	list: Int32Array,
	count: number,
	cross: Float64Array,
	targetU: number
): number {
	for (let i = 0; i < count; i++) {
		const s = list[i];
		if (column[s] - targetU === 0) {
			cross[s] = 0;
			list[i--] = list[--count];
		}
	}
	return count;
}

/**
 * Records the depth at which each pending sample crosses the isotherm between the previous depth
 * (U in transform bPrev) and this one (transform b), and drops it from the list; returns the count.
 */
function scanIsotherm(
	column: Float64Array,
	previous: Float64Array,
	list: Int32Array,
	count: number,
	cross: Float64Array,
	targetC: number,
	b: number,
	bPrev: number,
	zPrevM: number,
	zM: number
): number {
	const tu = kirchhoffTarget(targetC, b);
	const tuPrev = kirchhoffTarget(targetC, bPrev);
	for (let i = 0; i < count; i++) {
		const s = list[i];
		const cur = column[s] - tu;
		const prev = previous[s] - tuPrev;
		if (cur === 0 || prev < 0 !== cur < 0) {
			// Interpolate linearly in T, like isothermDepthM on a single profile.
			const t0 = fromKirchhoffC(previous[s], bPrev) - targetC;
			const t1 = fromKirchhoffC(column[s], b) - targetC;
			cross[s] = t1 === 0 || t0 === t1 ? zM : zPrevM + ((zM - zPrevM) * t0) / (t0 - t1);
			list[i--] = list[--count];
		}
	}
	return count;
}

/** Mean and sample standard deviation (°C) of T over a U column (one exp per sample). */
function momentsC(column: Float64Array, b: number): [number, number] {
	const n = column.length;
	let sum = 0;
	let sum2 = 0;
	for (let s = 0; s < n; s++) {
		const t = fromKirchhoffC(column[s], b);
		sum += t;
		sum2 += t * t;
	}
	const mean = sum / n;
	return [mean, Math.sqrt(Math.max(0, (sum2 - n * mean * mean) / (n - 1)))];
}

/** The same one-pass formula for n copies of one temperature, so depth 0 rounds like the rest. */
function constantMoments(temperatureC: number, n: number): [number, number] {
	let sum = 0;
	let sum2 = 0;
	for (let s = 0; s < n; s++) {
		sum += temperatureC;
		sum2 += temperatureC * temperatureC;
	}
	const mean = sum / n;
	return [mean, Math.sqrt(Math.max(0, (sum2 - n * mean * mean) / (n - 1)))];
}

/** Type-7 percentile in T from the two order statistics of U around it: both order statistics are mapped back to T
 * before interpolating, so the result is type 7 in T (interpolating in U would not be). */
function bandValueC([lo, hi, weight]: [number, number, number], b: number): number {
	const tLo = fromKirchhoffC(lo, b);
	return weight === 0 ? tLo : tLo + weight * (fromKirchhoffC(hi, b) - tLo);
}

/** U of an isotherm in a layer's transform; −∞ when 1 + bT <= 0 (every sample is hotter). */
function kirchhoffTarget(temperatureC: number, b: number): number {
	return 1 + b * temperatureC > 0 ? toKirchhoffC(temperatureC, b) : -Infinity;
}

function triple(values: Float64Array, convert: (v: number) => number): PercentileTriple {
	const [p10, p50, p90] = percentilesInPlace(values.slice(), P);
	return { p10: convert(p10), p50: convert(p50), p90: convert(p90) };
}

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
import { ThermalInputError } from './errors';
import { DEFAULT_DEPTH_STEP_M, prepareGeotherm } from './geotherm';
import {
	fromKirchhoffC,
	heatFlowInLayerWm2,
	integratedHeatProductionWm2,
	kirchhoffInLayerC,
	toKirchhoffC
} from './layer';
import { percentilesInPlace } from './percentile';
import { createRandom } from './random';
import { SampleOrder } from './tracker';
import { sampleDepthsM } from './sampling';
import type { GeothermInput } from './types';
import { requireFinite, requireNonNegative, requirePositive } from './validate';

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
	samples?: number; // default 1000
	seed?: number; // default 1
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
	const n = input.samples ?? 1000;
	if (!Number.isInteger(n) || n < 2 || n > 10_000_000) {
		throw new ThermalInputError('samples', n, 'must be an integer between 2 and 10,000,000');
	}
	const seed = input.seed ?? 1;
	requireFinite('seed', seed);
	const step = input.model.depthStepM ?? DEFAULT_DEPTH_STEP_M;
	requirePositive('depthStepM', step);
	const sigmaQ = input.heatFlowSigmaMWm2 ?? 0;
	requireNonNegative('heatFlowSigmaMWm2', sigmaQ);
	const [qMin, qMax] = input.heatFlowBoundsMWm2 ?? [0, Infinity];
	const isotherms = input.isothermsC ?? [];
	isotherms.forEach((t, i) => requireFinite(`isothermsC[${i}]`, t));
	const uncertainties = input.layers ?? [];
	if (uncertainties.length > central.layers.length) {
		throw new ThermalInputError(
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

	// Per-layer columns over samples: conductivity, top heat production, top heat flow, top U.
	const k0 = layers.map(() => new Float64Array(n));
	const aTop = layers.map(() => new Float64Array(n));
	const qTop = layers.map(() => new Float64Array(n));
	const uTop = layers.map(() => new Float64Array(n));
	const q0 = new Float64Array(n);
	const qb = new Float64Array(n);
	const random = createRandom(seed);
	for (let s = 0; s < n; s++) {
		const qDraw =
			drawTruncated(random, qDist, qMean, sigmaQ, qMin, qMax, 'heatFlowSigmaMWm2') * 1e-3;
		let production = 0;
		for (let j = 0; j < L; j++) {
			const u = uncertainties[j] ?? {};
			const lay = layers[j];
			k0[j][s] = drawTruncated(
				random,
				kDist,
				lay.k0WmK,
				u.conductivitySigmaWmK ?? 0,
				Number.MIN_VALUE,
				Infinity,
				`layers[${j}].conductivitySigmaWmK`
			);
			aTop[j][s] =
				drawTruncated(
					random,
					aDist,
					lay.aTopWm3 * 1e6,
					u.heatProductionSigmaUWm3 ?? 0,
					0,
					Infinity,
					`layers[${j}].heatProductionSigmaUWm3`
				) * 1e-6;
			production += integratedHeatProductionWm2(aTop[j][s], lay.decayM, lay.bottomM - lay.topM);
		}
		let q = basal ? qDraw + production : qDraw;
		let t = central.surfaceTemperatureC;
		q0[s] = q;
		for (let j = 0; j < L; j++) {
			const lay = layers[j];
			const thickness = lay.bottomM - lay.topM;
			if (!(1 + lay.b * t > 0)) {
				throw new ThermalInputError(
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
		qb[s] = basal ? qDraw : q;
	}
	// U(z) = uTop + (qTop/k0)·sM − (aTop/k0)·w(sM): keep the two ratios so the depth loop has no division.
	const qOverK = layers.map((_, j) => qTop[j].map((q, s) => q / k0[j][s]));
	const aOverK = layers.map((_, j) => aTop[j].map((a, s) => a / k0[j][s]));

	const depthM = sampleDepthsM(
		layers.map((l) => l.bottomM),
		step
	);
	const D = depthM.length;
	const p10C = new Array<number>(D);
	const p50C = new Array<number>(D);
	const p90C = new Array<number>(D);
	const moments = input.moments === true;
	const meanC: number[] = [];
	const sdC: number[] = [];
	// The column holds the Kirchhoff variable U of the current layer, not T: T(U) is increasing, so
	// ranks, percentiles and isotherm crossings can be found on U and only a handful of values
	// mapped back, which saves a transcendental per sample and depth.
	let column = new Float64Array(n);
	let previous = new Float64Array(n);
	const order = new SampleOrder(n);
	const crossings = isotherms.map(() => new Float64Array(n).fill(Infinity));
	// Samples that have not crossed each isotherm yet; crossed ones are swapped out of the list.
	const pending = isotherms.map(() => Int32Array.from({ length: n }, (_, s) => s));
	const pendingCount = isotherms.map(() => n);
	let prevB = layers[0].b;
	let li = 0;
	for (let d = 0; d < D; d++) {
		const z = depthM[d];
		while (li < L - 1 && z > layers[li].bottomM) li++;
		const lay = layers[li];
		const b = lay.b;
		const sM = z - lay.topM;
		// U = uTop + (qTop·sM − aTop·w)/k0 with w the double integral of A/aTop (depth only).
		const w = kirchhoffInLayerC(0, 0, -1, lay.decayM, 1, sM);
		const qk = qOverK[li];
		const ak = aOverK[li];
		const uc = uTop[li];
		for (let s = 0; s < n; s++) column[s] = uc[s] + qk[s] * sM - ak[s] * w;

		for (let m = 0; m < isotherms.length; m++) {
			const target = isotherms[m];
			const cross = crossings[m];
			const list = pending[m];
			const tu = kirchhoffTarget(target, b);
			const tuPrev = kirchhoffTarget(target, prevB);
			let count = pendingCount[m];
			for (let i = 0; i < count; i++) {
				const s = list[i];
				const cur = column[s] - tu;
				let crossed = false;
				if (d === 0) {
					if (cur === 0) {
						cross[s] = 0;
						crossed = true;
					}
				} else {
					const prev = previous[s] - tuPrev;
					if (cur === 0 || prev < 0 !== cur < 0) {
						// Interpolate linearly in T, like isothermDepthM on a single profile.
						const t0 = fromKirchhoffC(previous[s], prevB) - target;
						const t1 = fromKirchhoffC(column[s], b) - target;
						const z0 = depthM[d - 1];
						cross[s] = t1 === 0 || t0 === t1 ? z : z0 + ((z - z0) * t0) / (t0 - t1);
						crossed = true;
					}
				}
				if (crossed) list[i--] = list[--count];
			}
			pendingCount[m] = count;
		}

		if (d === 0) {
			p10C[0] = p50C[0] = p90C[0] = central.surfaceTemperatureC;
		} else {
			order.update(column);
			p10C[d] = bandValueC(order, P[0], b);
			p50C[d] = bandValueC(order, P[1], b);
			p90C[d] = bandValueC(order, P[2], b);
		}
		if (moments) {
			let sum = 0;
			let sum2 = 0;
			for (let s = 0; s < n; s++) {
				const t = d === 0 ? central.surfaceTemperatureC : fromKirchhoffC(column[s], b);
				sum += t;
				sum2 += t * t;
			}
			const mean = sum / n;
			meanC.push(mean);
			sdC.push(Math.sqrt(Math.max(0, (sum2 - n * mean * mean) / (n - 1))));
		}
		[previous, column] = [column, previous];
		prevB = b;
	}

	return {
		depthM,
		p10C,
		p50C,
		p90C,
		...(moments ? { meanC, sdC } : {}),
		surfaceHeatFlowMWm2: triple(q0, 1e3),
		basalHeatFlowMWm2: triple(qb, 1e3),
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

/** Type-7 percentile in T of the sorted U column: both order statistics are mapped back to T
 * before interpolating, so the result is type 7 in T (interpolating in U would not be). */
function bandValueC(order: SampleOrder, p: number, b: number): number {
	const [lo, hi, weight] = order.ranks(p);
	const tLo = fromKirchhoffC(lo, b);
	return weight === 0 ? tLo : tLo + weight * (fromKirchhoffC(hi, b) - tLo);
}

/** U of an isotherm in a layer's transform; −∞ when 1 + bT <= 0 (every sample is hotter). */
function kirchhoffTarget(temperatureC: number, b: number): number {
	return 1 + b * temperatureC > 0 ? toKirchhoffC(temperatureC, b) : -Infinity;
}

function triple(values: Float64Array, scale: number): PercentileTriple {
	const [p10, p50, p90] = percentilesInPlace(values.slice(), P);
	return { p10: p10 * scale, p50: p50 * scale, p90: p90 * scale };
}

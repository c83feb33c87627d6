// Steady 1-D conductive geotherm, solved layer by layer in closed form (docs/science.md#steady-conduction):
// each layer starts from the temperature and heat flow at its top and hands both to the next
// (Chapman 1986). Uniform and exponentially decaying heat production (Lachenbruch 1970;
// Turcotte & Schubert ch. 4) and k(T) = k0/(1 + bT) via the Kirchhoff transform (Carslaw & Jaeger)
// combine freely because heat flow does not depend on temperature.
// Assumptions: steady state, one dimension, conduction only; no advection, no transients.

import { InputError } from '../foundation/errors';
import {
	evaluateLayerRange,
	fromKirchhoffC,
	heatFlowInLayerWm2,
	integratedHeatProductionWm2,
	kirchhoffInLayerC,
	toKirchhoffC
} from './layer';
import { sampleDepthsM } from './sampling';
import type { CrustLayer, GeothermInput, GeothermProfile } from './types';
import { MAX_PLAUSIBLE_HEAT_FLOW_MWM2, SOLVER_OUTPUT_STEP_M } from '../foundation/limits';
import { requireFinite, requireNonNegative, requirePositive } from '../foundation/validate';
import { mWm2ToWm2, uWm3ToWm3, wm2ToMWm2 } from '../geo/units';

/** A layer in SI units with the state at its top; what the closed forms consume. */
export interface PreparedLayer {
	topM: number;
	bottomM: number;
	k0WmK: number;
	b: number; // 1/K, 0 = constant conductivity
	aTopWm3: number;
	decayM: number; // Infinity = uniform heat production
	qTopWm2: number;
	uTopC: number; // Kirchhoff variable at the top, in this layer's own transform
	tTopC: number;
}

/**
 * A validated model ready to evaluate at any depth. The layers work in SI; the boundary heat flows
 * are in mW/m² like the input, and the one the input gave is passed through unchanged.
 */
export interface PreparedGeotherm {
	layers: PreparedLayer[];
	surfaceTemperatureC: number;
	surfaceHeatFlowMWm2: number;
	basalHeatFlowMWm2: number;
	baseTemperatureC: number;
	warnings: string[];
}

/** Checks one layer and throws a InputError naming `layers[i].field` and the value. */
export function validateLayer(layer: CrustLayer, index: number): void {
	const f = (name: string) => `layers[${index}].${name}`;
	if (layer === null || typeof layer !== 'object') {
		throw new InputError(`layers[${index}]`, layer, 'must be a layer object');
	}
	requirePositive(f('thicknessM'), layer.thicknessM);
	requirePositive(f('conductivityWmK'), layer.conductivityWmK);
	requireNonNegative(f('heatProductionUWm3'), layer.heatProductionUWm3);
	if (layer.heatProductionDecayM != null) {
		// Infinity is allowed: it is the uniform limit and behaves exactly like "unset".
		if (layer.heatProductionDecayM !== Infinity) {
			requirePositive(f('heatProductionDecayM'), layer.heatProductionDecayM);
		}
	}
	if (layer.conductivityTempCoeffPerK != null) {
		requireNonNegative(f('conductivityTempCoeffPerK'), layer.conductivityTempCoeffPerK);
	}
}

/** Checks the boundary conditions; returns which one was given. */
function boundaryCondition(input: GeothermInput): 'surface' | 'basal' {
	const hasSurface = input.surfaceHeatFlowMWm2 != null;
	const hasBasal = input.basalHeatFlowMWm2 != null;
	if (hasSurface === hasBasal) {
		throw new InputError(
			hasSurface ? 'surfaceHeatFlowMWm2/basalHeatFlowMWm2' : 'surfaceHeatFlowMWm2',
			hasSurface ? [input.surfaceHeatFlowMWm2, input.basalHeatFlowMWm2] : undefined,
			'give exactly one of surfaceHeatFlowMWm2 and basalHeatFlowMWm2'
		);
	}
	if (hasSurface) requireFinite('surfaceHeatFlowMWm2', input.surfaceHeatFlowMWm2 as number);
	else requireFinite('basalHeatFlowMWm2', input.basalHeatFlowMWm2 as number);
	return hasSurface ? 'surface' : 'basal';
}

/** Validates an input and computes T and q at every layer top (closed form, SI inside). */
export function prepareGeotherm(input: GeothermInput): PreparedGeotherm {
	if (input === null || typeof input !== 'object') {
		throw new InputError('input', input, 'must be a GeothermInput object');
	}
	requireFinite('surfaceTemperatureC', input.surfaceTemperatureC);
	const bc = boundaryCondition(input);
	if (!Array.isArray(input.layers) || input.layers.length === 0) {
		throw new InputError('layers', input.layers, 'must be a non-empty array of layers');
	}
	input.layers.forEach(validateLayer);

	let totalProductionWm2 = 0;
	for (const layer of input.layers) {
		totalProductionWm2 += integratedHeatProductionWm2(
			uWm3ToWm3(layer.heatProductionUWm3),
			layer.heatProductionDecayM ?? Infinity,
			layer.thicknessM
		);
	}
	// Energy balance over the whole column: q0 = qb + ∫A dz (Turcotte & Schubert ch. 4).
	const surfaceHeatFlowWm2 =
		bc === 'surface'
			? mWm2ToWm2(input.surfaceHeatFlowMWm2 as number)
			: mWm2ToWm2(input.basalHeatFlowMWm2 as number) + totalProductionWm2;

	const layers: PreparedLayer[] = [];
	let topM = 0;
	let tTopC = input.surfaceTemperatureC;
	let qTopWm2 = surfaceHeatFlowWm2;
	input.layers.forEach((layer, i) => {
		const b = layer.conductivityTempCoeffPerK ?? 0;
		if (!(1 + b * tTopC > 0)) {
			// k = k0/(1 + bT) is undefined (infinite or negative) there.
			throw new InputError(
				i === 0 ? 'surfaceTemperatureC' : `layers[${i}].conductivityTempCoeffPerK`,
				i === 0 ? tTopC : b,
				`makes 1 + b·T <= 0 at the top of layer ${i} (T = ${tTopC} °C, b = ${b} /K)`
			);
		}
		const prepared: PreparedLayer = {
			topM,
			bottomM: topM + layer.thicknessM,
			k0WmK: layer.conductivityWmK,
			b,
			aTopWm3: uWm3ToWm3(layer.heatProductionUWm3),
			decayM: layer.heatProductionDecayM ?? Infinity,
			qTopWm2,
			uTopC: toKirchhoffC(tTopC, b),
			tTopC
		};
		layers.push(prepared);
		const s = layer.thicknessM;
		qTopWm2 = heatFlowInLayerWm2(prepared.qTopWm2, prepared.aTopWm3, prepared.decayM, s);
		tTopC = fromKirchhoffC(
			kirchhoffInLayerC(
				prepared.uTopC,
				prepared.qTopWm2,
				prepared.aTopWm3,
				prepared.decayM,
				prepared.k0WmK,
				s
			),
			b
		);
		topM = prepared.bottomM;
	});

	// The boundary heat flow the input gave is kept as given; only the other one is derived.
	const surfaceHeatFlowMWm2 =
		bc === 'surface' ? (input.surfaceHeatFlowMWm2 as number) : wm2ToMWm2(surfaceHeatFlowWm2);
	const basalHeatFlowMWm2 =
		bc === 'basal' ? (input.basalHeatFlowMWm2 as number) : wm2ToMWm2(qTopWm2);
	return {
		layers,
		surfaceTemperatureC: input.surfaceTemperatureC,
		surfaceHeatFlowMWm2,
		basalHeatFlowMWm2,
		baseTemperatureC: tTopC,
		warnings: plausibilityWarnings(surfaceHeatFlowMWm2, basalHeatFlowMWm2, bc)
	};
}

/** Warnings for allowed but suspicious boundary heat flows (mW/m²; limits in foundation/limits.ts). */
export function plausibilityWarnings(q0: number, qb: number, bc: 'surface' | 'basal'): string[] {
	const warnings: string[] = [];
	if (q0 < 0) {
		warnings.push(
			`surface heat flow is negative (${q0.toFixed(3)} mW/m²)` +
				(bc === 'basal' ? ': the basal heat flow is below minus the crustal heat production' : '')
		);
	} else if (qb < 0) {
		warnings.push(
			`heat flow turns negative at depth (basal ${qb.toFixed(3)} mW/m²): ` +
				'the layers produce more heat than the surface heat flow carries, so temperature falls with depth'
		);
	}
	if (q0 > MAX_PLAUSIBLE_HEAT_FLOW_MWM2) {
		warnings.push(
			`surface heat flow ${q0.toFixed(1)} mW/m² is above ${MAX_PLAUSIBLE_HEAT_FLOW_MWM2} (implausible outside volcanic areas)`
		);
	}
	return warnings;
}

/** Index of the layer containing depthM (a boundary belongs to the layer above it). */
export function layerIndexAt(layers: readonly PreparedLayer[], depthM: number): number {
	let i = 0;
	while (i < layers.length - 1 && depthM > layers[i].bottomM) i++;
	return i;
}

/** Temperature (°C) and heat flow (W/m²) of a prepared model at depthM inside layer i. */
export function evaluateInLayer(layer: PreparedLayer, depthM: number): [number, number] {
	const s = depthM - layer.topM;
	const q = heatFlowInLayerWm2(layer.qTopWm2, layer.aTopWm3, layer.decayM, s);
	const u = kirchhoffInLayerC(
		layer.uTopC,
		layer.qTopWm2,
		layer.aTopWm3,
		layer.decayM,
		layer.k0WmK,
		s
	);
	return [fromKirchhoffC(u, layer.b), q];
}

/** Solves a layered steady geotherm in closed form; outputs °C and mW/m² at the sample depths (m). */
export function solveGeotherm(input: GeothermInput): GeothermProfile {
	const model = prepareGeotherm(input);
	const step = input.depthStepM ?? SOLVER_OUTPUT_STEP_M;
	requirePositive('depthStepM', step);
	const bases = model.layers.map((l) => l.bottomM);
	const depthM = sampleDepthsM(bases, step);
	const temperatureC = new Array<number>(depthM.length);
	const heatFlowMWm2 = new Array<number>(depthM.length);
	let i = 0;
	for (let li = 0; li < model.layers.length; li++) {
		const last = li === model.layers.length - 1;
		const layer = model.layers[li];
		let end = i;
		while (end < depthM.length && (last || depthM[end] <= layer.bottomM)) end++;
		evaluateLayerRange(layer, depthM, i, end, temperatureC, heatFlowMWm2);
		i = end;
	}
	// The end samples repeat the boundary values exactly rather than re-deriving them.
	heatFlowMWm2[0] = model.surfaceHeatFlowMWm2;
	heatFlowMWm2[depthM.length - 1] = model.basalHeatFlowMWm2;
	temperatureC[0] = model.surfaceTemperatureC;
	return {
		depthM,
		temperatureC,
		heatFlowMWm2,
		surfaceHeatFlowMWm2: model.surfaceHeatFlowMWm2,
		basalHeatFlowMWm2: model.basalHeatFlowMWm2,
		layerBaseDepthsM: bases,
		warnings: model.warnings
	};
}

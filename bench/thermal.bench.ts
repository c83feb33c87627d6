// Timings of the thermal core. Run with `npm run bench -- thermal` (or `npx tsx bench/thermal.bench.ts`).
// Each case runs once to warm up, then REPEATS times; the figure is the median.

import {
	heatFlowFromLog,
	monteCarloGeotherm,
	solveGeotherm,
	type CrustLayer,
	type GeothermInput
} from '../src/lib/thermal/index';
import { figure, size } from './report';

const REPEATS = size(5, 1);
const GEOTHERMS = size(10_000, 10);
const MC_SAMPLES = size(10_000, 50);

// An invented four-layer lithosphere to 100 km: every closed-form feature is exercised.
const layers: CrustLayer[] = [
	{
		thicknessM: 10_000,
		conductivityWmK: 3.0,
		heatProductionUWm3: 2.5,
		heatProductionDecayM: 10_000
	},
	{
		thicknessM: 10_000,
		conductivityWmK: 2.6,
		heatProductionUWm3: 0.8,
		conductivityTempCoeffPerK: 1e-3
	},
	{
		thicknessM: 15_000,
		conductivityWmK: 2.2,
		heatProductionUWm3: 0.3,
		conductivityTempCoeffPerK: 5e-4
	},
	{
		thicknessM: 65_000,
		conductivityWmK: 3.3,
		heatProductionUWm3: 0.02,
		conductivityTempCoeffPerK: 3e-4
	}
];
const model: GeothermInput = {
	surfaceTemperatureC: 10,
	surfaceHeatFlowMWm2: 65,
	depthStepM: 100,
	layers
};

function median(values: number[]): number {
	const s = [...values].sort((a, b) => a - b);
	return s[Math.floor(s.length / 2)];
}

function time(fn: () => unknown): number {
	fn();
	const runs: number[] = [];
	for (let i = 0; i < REPEATS; i++) {
		const t0 = performance.now();
		fn();
		runs.push(performance.now() - t0);
	}
	return median(runs);
}

let sink = 0; // keeps results alive so nothing is optimised away

const geotherms = () => {
	for (let i = 0; i < GEOTHERMS; i++) {
		const p = solveGeotherm({ ...model, surfaceHeatFlowMWm2: 55 + (i % 20) });
		sink += p.temperatureC[p.temperatureC.length - 1];
	}
};

const monteCarlo = (stepM: number) => () => {
	const band = monteCarloGeotherm({
		model: { ...model, depthStepM: stepM },
		heatFlowSigmaMWm2: 6,
		layers: layers.map((l) => ({
			conductivitySigmaWmK: 0.1 * l.conductivityWmK,
			heatProductionSigmaUWm3: 0.2 * l.heatProductionUWm3
		})),
		samples: MC_SAMPLES,
		seed: 1,
		isothermsC: [300, 600]
	});
	sink += band.p50C[band.p50C.length - 1];
};

// A 5,000-point log at 1 m spacing through 50 conductivity units with a little noise.
const depthM = Array.from({ length: 5000 }, (_, i) => i);
const conductivity = Array.from({ length: 50 }, (_, j) => ({
	topM: j * 100,
	bottomM: (j + 1) * 100,
	conductivityWmK: 2 + (j % 5) * 0.3,
	sigmaWmK: 0.1
}));
let r = 0;
const temperatureC = depthM.map((z, i) => {
	r += 1 / conductivity[Math.min(49, Math.floor(z / 100))].conductivityWmK;
	return 12 + 0.06 * r + 0.01 * Math.sin(i * 12.9898);
});
const bullard = () => {
	sink += heatFlowFromLog({ depthM, temperatureC, conductivity, method: 'bullard' }).heatFlowMWm2;
};

const cases: [string, string, () => unknown, number][] = [
	[
		'thermal.geotherms-10k',
		'10,000 four-layer geotherms to 100 km at 100 m spacing',
		geotherms,
		1000
	],
	[
		'thermal.monte-carlo-100m',
		'Monte Carlo band, 10,000 samples, 1,001 depths (100 m spacing)',
		monteCarlo(100),
		300
	],
	[
		'thermal.monte-carlo-1km',
		'Monte Carlo band, 10,000 samples, 101 depths (1 km spacing)',
		monteCarlo(1000),
		300
	],
	['thermal.bullard-5k', 'Bullard fit of a 5,000-point log, 50 units', bullard, 50]
];

for (const [id, label, fn, target] of cases) {
	figure({
		id,
		label,
		value: time(fn),
		unit: 'ms',
		target,
		better: 'lower',
		note: `median of ${REPEATS}`
	});
}
if (!Number.isFinite(sink)) throw new Error('a thermal result was not finite');

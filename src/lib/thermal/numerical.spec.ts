import { describe, expect, it } from 'vitest';
import { InputError } from '../foundation/errors';
import { solveGeotherm } from './geotherm';
import { segmentsFromLayers, solveGeothermNumerical } from './numerical';
import type { CrustLayer } from './types';
import { expectClose, thrown } from '../foundation/testing';

// Two layers with a jump in k and A, exponential decay and k(T) in both: every closed-form case of
// docs/science.md#steady-conduction at once, so the RK4 solver is checked against all of them.
const layers: CrustLayer[] = [
	{
		thicknessM: 15_000,
		conductivityWmK: 2.6,
		heatProductionUWm3: 2.5,
		heatProductionDecayM: 8000,
		conductivityTempCoeffPerK: 1e-3
	},
	{
		thicknessM: 25_000,
		conductivityWmK: 2.1,
		heatProductionUWm3: 0.4,
		heatProductionDecayM: 20_000,
		conductivityTempCoeffPerK: 5e-4
	}
];

function baseError(stepM: number, basal: boolean): number {
	const bc = basal ? { basalHeatFlowMWm2: 30 } : { surfaceHeatFlowMWm2: 70 };
	const exact = solveGeotherm({ surfaceTemperatureC: 10, ...bc, layers, depthStepM: 40_000 });
	const rk4 = solveGeothermNumerical({
		surfaceTemperatureC: 10,
		...bc,
		segments: segmentsFromLayers(layers),
		depthStepM: 40_000,
		integrationStepM: stepM
	});
	return Math.abs(rk4.temperatureC.at(-1)! - exact.temperatureC.at(-1)!);
}

describe('RK4 solver (dT/dz = q/k(T,z), dq/dz = −A(z); classical Runge–Kutta, Press et al. 2007 ch. 17)', () => {
	it.each([false, true])(
		'converges to the closed form at fourth order (basal condition: %s)',
		(basal) => {
			// Observed order p = log2(e(h)/e(h/2)) from successive halvings; classical RK4 has p = 4.
			const steps = [5000, 2500, 1250, 625];
			const errors = steps.map((h) => baseError(h, basal));
			for (let i = 1; i < errors.length; i++) {
				const order = Math.log2(errors[i - 1] / errors[i]);
				expect(order, `order between h=${steps[i - 1]} and ${steps[i]}`).toBeGreaterThan(3.7);
				expect(order).toBeLessThan(4.3);
			}
			expect(errors.at(-1)!).toBeLessThan(1e-3);
		}
	);

	it('agrees with the closed form to 1e-7 °C at every sample with a 50 m step', () => {
		const exact = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 70,
			layers,
			depthStepM: 500
		});
		const rk4 = solveGeothermNumerical({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 70,
			segments: segmentsFromLayers(layers),
			depthStepM: 500,
			integrationStepM: 50
		});
		expect(rk4.depthM).toEqual(exact.depthM);
		rk4.temperatureC.forEach((t, i) =>
			expectClose(t, exact.temperatureC[i], { abs: 1e-7 }, `T[${i}]`)
		);
		rk4.heatFlowMWm2.forEach((q, i) =>
			expectClose(q, exact.heatFlowMWm2[i], { abs: 1e-9 }, `q[${i}]`)
		);
	});

	it('handles a depth-dependent conductivity with no closed form, converging at fourth order (self-convergence)', () => {
		// k rises with depth (a pressure-like effect; invented scenario). Without a closed form the
		// order comes from three solutions: p = log2((T_h − T_h/2)/(T_h/2 − T_h/4)).
		const segments = [
			{
				thicknessM: 30_000,
				conductivityWmK: (t: number, z: number) => (2.5 * (1 + 1.5e-5 * z)) / (1 + 1e-3 * t),
				heatProductionUWm3: (z: number) => 1.5 * Math.exp(-z / 12_000)
			}
		];
		const base = (h: number) =>
			solveGeothermNumerical({
				surfaceTemperatureC: 5,
				surfaceHeatFlowMWm2: 65,
				segments,
				depthStepM: 30_000,
				integrationStepM: h
			}).temperatureC.at(-1)!;
		const [a, b, c, d] = [6000, 3000, 1500, 750].map(base);
		for (const order of [Math.log2((a - b) / (b - c)), Math.log2((b - c) / (c - d))]) {
			expect(order).toBeGreaterThan(3.6);
			expect(order).toBeLessThan(4.4);
		}
	});

	it('throws InputErrors for bad input', () => {
		const segments = segmentsFromLayers(layers);
		const e = thrown(() => solveGeothermNumerical({ surfaceTemperatureC: 0, segments }));
		expect(e).toBeInstanceOf(InputError);
		expect(e.field).toBe('surfaceHeatFlowMWm2');
		expect(
			thrown(() =>
				solveGeothermNumerical({
					surfaceTemperatureC: 0,
					surfaceHeatFlowMWm2: 60,
					segments,
					integrationStepM: -1
				})
			).field
		).toBe('integrationStepM');
		expect(thrown(() => segmentsFromLayers([{ ...layers[0], thicknessM: -5 }])).field).toBe(
			'layers[0].thicknessM'
		);
		expect(
			thrown(() =>
				solveGeothermNumerical({ surfaceTemperatureC: 0, surfaceHeatFlowMWm2: 60, segments: [] })
			).field
		).toBe('segments');
	});
});

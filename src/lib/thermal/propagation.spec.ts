import { describe, expect, it } from 'vitest';
import { solveGeotherm } from './geotherm';
import { uniformTemperatureBand } from './propagation';
import { expectClose, thrown } from '../foundation/testing';

const input = {
	surfaceTemperatureC: 10,
	surfaceHeatFlowMWm2: 60,
	sigmaSurfaceHeatFlowMWm2: 3,
	conductivityWmK: 2.5,
	sigmaConductivityWmK: 0.2,
	heatProductionUWm3: 1,
	sigmaHeatProductionUWm3: 0.3
};

function tAt(q: number, k: number, a: number, z: number): number {
	const p = solveGeotherm({
		surfaceTemperatureC: 10,
		surfaceHeatFlowMWm2: q,
		depthStepM: z,
		layers: [{ thicknessM: z, conductivityWmK: k, heatProductionUWm3: a }]
	});
	return p.temperatureC.at(-1)!;
}

describe('first-order propagation, uniform case (Taylor 1997 ch. 3)', () => {
	it('reproduces the worked temperature 230 °C at 10 km (Turcotte & Schubert ch. 4)', () => {
		const band = uniformTemperatureBand(input, [0, 10_000]);
		expectClose(band.temperatureC[1], 230, { abs: 1e-9 }, 'T');
		expect(band.sigmaC[0]).toBe(0);
	});

	it('uses derivatives that match central finite differences of the closed form', () => {
		const z = 20_000;
		const h = { q: 1e-3, k: 1e-5, a: 1e-5 };
		const dq = (tAt(60 + h.q, 2.5, 1, z) - tAt(60 - h.q, 2.5, 1, z)) / (2 * h.q);
		const dk = (tAt(60, 2.5 + h.k, 1, z) - tAt(60, 2.5 - h.k, 1, z)) / (2 * h.k);
		const da = (tAt(60, 2.5, 1 + h.a, z) - tAt(60, 2.5, 1 - h.a, z)) / (2 * h.a);
		const expected = Math.sqrt((dq * 3) ** 2 + (dk * 0.2) ** 2 + (da * 0.3) ** 2);
		expectClose(uniformTemperatureBand(input, [z]).sigmaC[0], expected, { rel: 1e-6 }, 'σT');
	});

	it('gives a symmetric P10/P90 band and rejects negative sigmas', () => {
		const band = uniformTemperatureBand(input, [5000]);
		expectClose(
			band.p90C[0] - band.temperatureC[0],
			band.temperatureC[0] - band.p10C[0],
			{ abs: 1e-9 },
			'symmetry'
		);
		expect(
			thrown(() => uniformTemperatureBand({ ...input, sigmaConductivityWmK: -1 }, [0])).field
		).toBe('sigmaConductivityWmK');
	});
});

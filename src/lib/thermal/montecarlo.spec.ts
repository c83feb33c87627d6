import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveGeotherm } from './geotherm';
import { drawTruncated } from './distributions';
import { monteCarloGeotherm, type MonteCarloInput } from './montecarlo';
import { createRandom } from '../foundation/random';
import { NORMAL_Z90, uniformTemperatureBand } from './propagation';
import type { CrustLayer, GeothermInput } from './types';
import { expectClose, thrown } from '../foundation/testing';

const uniform: GeothermInput = {
	surfaceTemperatureC: 10,
	surfaceHeatFlowMWm2: 60,
	depthStepM: 5000,
	layers: [{ thicknessM: 40_000, conductivityWmK: 2.5, heatProductionUWm3: 1 }]
};

describe('Monte Carlo geotherm bands (type-7 percentiles, Hyndman & Fan 1996; normal quantiles from memory)', () => {
	it('is reproducible for a seed and changes with the seed', () => {
		const run = (seed: number) =>
			monteCarloGeotherm({
				model: uniform,
				heatFlowSigmaMWm2: 6,
				layers: [{ conductivitySigmaWmK: 0.3 }],
				samples: 500,
				seed
			});
		expect(run(7)).toEqual(run(7));
		expect(run(7).p50C).not.toEqual(run(8).p50C);
	});

	it('collapses to the deterministic profile when nothing is uncertain', () => {
		const band = monteCarloGeotherm({ model: uniform, samples: 50 });
		const p = solveGeotherm(uniform);
		expect(band.depthM).toEqual(p.depthM);
		band.depthM.forEach((_, i) => {
			for (const v of [band.p10C[i], band.p50C[i], band.p90C[i]])
				expectClose(v, p.temperatureC[i], { abs: 1e-9 }, `T[${i}]`);
		});
	});

	it('agrees with first-order propagation for 1 % uncertainties (Taylor 1997 ch. 3; docs/science.md#uncertainty)', () => {
		const sigmas = { q: 0.6, k: 0.025, a: 0.01 };
		const band = monteCarloGeotherm({
			model: uniform,
			heatFlowSigmaMWm2: sigmas.q,
			layers: [{ conductivitySigmaWmK: sigmas.k, heatProductionSigmaUWm3: sigmas.a }],
			samples: 20_000,
			seed: 42,
			moments: true
		});
		const lin = uniformTemperatureBand(
			{
				surfaceTemperatureC: 10,
				surfaceHeatFlowMWm2: 60,
				sigmaSurfaceHeatFlowMWm2: sigmas.q,
				conductivityWmK: 2.5,
				sigmaConductivityWmK: sigmas.k,
				heatProductionUWm3: 1,
				sigmaHeatProductionUWm3: sigmas.a
			},
			band.depthM
		);
		for (let i = 1; i < band.depthM.length; i++) {
			const s = lin.sigmaC[i];
			// Sampling error of a median is about 1.25 σ/√n ≈ 0.01 σ; allow 0.05 σ.
			expectClose(band.p50C[i], lin.temperatureC[i], { abs: 0.05 * s }, `P50 at ${band.depthM[i]}`);
			expectClose(band.p10C[i], lin.p10C[i], { abs: 0.05 * s }, `P10 at ${band.depthM[i]}`);
			expectClose(band.p90C[i], lin.p90C[i], { abs: 0.05 * s }, `P90 at ${band.depthM[i]}`);
			expectClose(band.sdC![i], s, { rel: 0.03 }, `sd at ${band.depthM[i]}`);
		}
	});

	it('gives isotherm-depth percentiles that match the normal quantiles of heat flow (A = 0, only q uncertain)', () => {
		// z(T) = (T − T0) k / q is decreasing in q, so the P10 depth comes from the P90 heat flow:
		// q90 = 60 + 1.2816·3 mW/m² (normal quantile, A&S Table 26.5, from memory).
		const model: GeothermInput = {
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 60,
			depthStepM: 100,
			layers: [{ thicknessM: 30_000, conductivityWmK: 2.5, heatProductionUWm3: 0 }]
		};
		const band = monteCarloGeotherm({
			model,
			heatFlowSigmaMWm2: 3,
			samples: 20_000,
			seed: 3,
			isothermsC: [300, 2000]
		});
		const depth = (qMWm2: number) => ((300 - 10) * 2.5) / (qMWm2 * 1e-3);
		const [iso, never] = band.isotherms;
		expectClose(iso.p10M!, depth(60 + NORMAL_Z90 * 3), { rel: 0.005 }, 'P10 depth');
		expectClose(iso.p50M!, depth(60), { rel: 0.005 }, 'P50 depth');
		expectClose(iso.p90M!, depth(60 - NORMAL_Z90 * 3), { rel: 0.005 }, 'P90 depth');
		expect(iso.fractionReached).toBe(1);
		expect(never).toEqual({
			temperatureC: 2000,
			p10M: null,
			p50M: null,
			p90M: null,
			fractionReached: 0
		});
		expectClose(band.surfaceHeatFlowMWm2.p90, 60 + NORMAL_Z90 * 3, { rel: 0.005 }, 'q P90');
	});

	it('truncates at physical bounds: conductivity > 0 and heat production >= 0 even for wide inputs', () => {
		const band = monteCarloGeotherm({
			model: { ...uniform, basalHeatFlowMWm2: 30, surfaceHeatFlowMWm2: undefined },
			heatFlowSigmaMWm2: 40,
			layers: [{ conductivitySigmaWmK: 3, heatProductionSigmaUWm3: 2 }],
			samples: 2000
		});
		for (const v of [...band.p10C, ...band.p90C]) expect(Number.isFinite(v)).toBe(true);
		expect(band.basalHeatFlowMWm2.p10).toBeGreaterThanOrEqual(0);
		expect(band.surfaceHeatFlowMWm2.p10).toBeGreaterThanOrEqual(band.basalHeatFlowMWm2.p10);
	});

	it('draws log-normal inputs with the requested mean and standard deviation', () => {
		// Log-normal median = mean/√(1 + cv²) (moment matching; standard result, no source).
		const band = monteCarloGeotherm({
			model: uniform,
			heatFlowSigmaMWm2: 30,
			distribution: 'lognormal',
			samples: 20_000,
			seed: 5
		});
		expectClose(band.surfaceHeatFlowMWm2.p50, 60 / Math.sqrt(1 + 0.25), { rel: 0.02 }, 'median q0');
	});

	it('rejects bad Monte Carlo settings with named fields', () => {
		expect(thrown(() => monteCarloGeotherm({ model: uniform, samples: 1 })).field).toBe('samples');
		expect(thrown(() => monteCarloGeotherm({ model: uniform, heatFlowSigmaMWm2: -1 })).field).toBe(
			'heatFlowSigmaMWm2'
		);
		expect(
			thrown(() => monteCarloGeotherm({ model: uniform, layers: [{ conductivitySigmaWmK: NaN }] }))
				.field
		).toBe('layers[0].conductivitySigmaWmK');
		expect(thrown(() => monteCarloGeotherm({ model: uniform, isothermsC: [Infinity] })).field).toBe(
			'isothermsC[0]'
		);
	});

	it('keeps P10 <= P50 <= P90 at every depth and for every isotherm (property over random models)', () => {
		const arb = fc.record({
			q: fc.double({ min: 30, max: 110, noNaN: true }),
			sq: fc.double({ min: 0, max: 20, noNaN: true }),
			k: fc.double({ min: 1.5, max: 4.5, noNaN: true }),
			sk: fc.double({ min: 0, max: 1, noNaN: true }),
			a: fc.double({ min: 0, max: 3, noNaN: true }),
			sa: fc.double({ min: 0, max: 1, noNaN: true }),
			b: fc.double({ min: 0, max: 1e-3, noNaN: true }),
			seed: fc.integer()
		});
		fc.assert(
			fc.property(arb, (m) => {
				const band = monteCarloGeotherm({
					model: {
						surfaceTemperatureC: 10,
						surfaceHeatFlowMWm2: m.q,
						depthStepM: 2000,
						layers: [
							{
								thicknessM: 15_000,
								conductivityWmK: m.k,
								heatProductionUWm3: m.a,
								heatProductionDecayM: 10_000
							},
							{
								thicknessM: 20_000,
								conductivityWmK: m.k,
								heatProductionUWm3: m.a / 4,
								conductivityTempCoeffPerK: m.b
							}
						]
					},
					heatFlowSigmaMWm2: m.sq,
					layers: [
						{ conductivitySigmaWmK: m.sk, heatProductionSigmaUWm3: m.sa },
						{ conductivitySigmaWmK: m.sk, heatProductionSigmaUWm3: m.sa / 4 }
					],
					samples: 200,
					seed: m.seed,
					isothermsC: [150, 400]
				});
				band.depthM.forEach((_, i) => {
					expect(band.p10C[i]).toBeLessThanOrEqual(band.p50C[i]);
					expect(band.p50C[i]).toBeLessThanOrEqual(band.p90C[i]);
				});
				for (const iso of band.isotherms) {
					const values = [iso.p10M, iso.p50M, iso.p90M].map((v) => v ?? Infinity);
					expect(values[0]).toBeLessThanOrEqual(values[1]);
					expect(values[1]).toBeLessThanOrEqual(values[2]);
				}
			}),
			{ numRuns: 60 }
		);
	});

	it('equals a straightforward reference (one solveGeotherm per sample, a full sort per depth) to 1e-9 °C', () => {
		// The reference redraws the inputs in the documented order (q, then k and A per layer) from
		// the same seed, solves every sample's profile on its own and sorts each depth's temperatures.
		const typeSeven = (sorted: number[], p: number) => {
			const h = (sorted.length - 1) * p;
			const k = Math.floor(h);
			return k + 1 < sorted.length ? sorted[k] + (h - k) * (sorted[k + 1] - sorted[k]) : sorted[k];
		};
		const reference = (input: MonteCarloInput & { model: { surfaceHeatFlowMWm2: number } }) => {
			const random = createRandom(input.seed!);
			const n = input.samples!;
			const profiles = Array.from({ length: n }, () => {
				const q = drawTruncated(
					random,
					'normal',
					input.model.surfaceHeatFlowMWm2,
					input.heatFlowSigmaMWm2!,
					0,
					Infinity,
					'q'
				);
				const layers: CrustLayer[] = input.model.layers.map((l, j) => ({
					...l,
					conductivityWmK: drawTruncated(
						random,
						'normal',
						l.conductivityWmK,
						input.layers![j].conductivitySigmaWmK!,
						Number.MIN_VALUE,
						Infinity,
						'k'
					),
					heatProductionUWm3: drawTruncated(
						random,
						'normal',
						l.heatProductionUWm3,
						input.layers![j].heatProductionSigmaUWm3!,
						0,
						Infinity,
						'a'
					)
				}));
				return solveGeotherm({ ...input.model, surfaceHeatFlowMWm2: q, layers });
			});
			const depthM = profiles[0].depthM;
			const band = { p10C: [] as number[], p50C: [] as number[], p90C: [] as number[] };
			depthM.forEach((_, d) => {
				const column = profiles.map((p) => p.temperatureC[d]).sort((a, b) => a - b);
				band.p10C.push(typeSeven(column, 0.1));
				band.p50C.push(typeSeven(column, 0.5));
				band.p90C.push(typeSeven(column, 0.9));
			});
			return { depthM, ...band };
		};
		const layers: CrustLayer[] = [
			{
				thicknessM: 7_000,
				conductivityWmK: 2.8,
				heatProductionUWm3: 2,
				heatProductionDecayM: 8_000
			},
			{
				thicknessM: 9_000,
				conductivityWmK: 2.4,
				heatProductionUWm3: 0.7,
				conductivityTempCoeffPerK: 1e-3
			},
			{
				thicknessM: 14_000,
				conductivityWmK: 3.1,
				heatProductionUWm3: 0.1,
				conductivityTempCoeffPerK: 3e-4
			}
		];
		for (const seed of [1, 2, 17, 2024]) {
			// Wide inputs on purpose, so samples cross each other often and the percentile ranks move.
			const input = {
				model: { surfaceTemperatureC: 8, surfaceHeatFlowMWm2: 70, depthStepM: 250, layers },
				heatFlowSigmaMWm2: 12,
				layers: layers.map((l) => ({
					conductivitySigmaWmK: 0.2 * l.conductivityWmK,
					heatProductionSigmaUWm3: 0.4 * l.heatProductionUWm3
				})),
				samples: 300 + seed,
				seed
			};
			const got = monteCarloGeotherm(input);
			const want = reference(input);
			expect(got.depthM).toEqual(want.depthM);
			for (const key of ['p10C', 'p50C', 'p90C'] as const)
				got[key].forEach((v, d) =>
					expectClose(v, want[key][d], { abs: 1e-9 }, `seed ${seed} ${key}[${d}]`)
				);
		}
	});
});

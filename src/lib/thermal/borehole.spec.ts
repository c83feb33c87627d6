import { describe, expect, it } from 'vitest';
import { bullardPlot, heatFlowFromLog, temperatureGradient } from './borehole';
import { InputError } from '../foundation/errors';
import type { ConductivityInterval } from './intervals';
import { linearFit } from './regression';
import { expectClose, thrown } from '../foundation/testing';

describe('least-squares line with standard errors (common practice, no source)', () => {
	it('matches a hand computation', () => {
		// x̄ = 1.5, ȳ = 1.25, Sxx = 5, Sxy = 4.5 → slope 0.9, intercept −0.1; residuals 0.1, 0.2, −0.7,
		// 0.4 → SSR 0.70, s² = 0.35, σ_slope = √(0.35/5), σ_intercept = √(0.35 (1/4 + 2.25/5)).
		const fit = linearFit([0, 1, 2, 3], [0, 1, 1, 3]);
		expectClose(fit.slope, 0.9, { abs: 1e-12 }, 'slope');
		expectClose(fit.intercept, -0.1, { abs: 1e-12 }, 'intercept');
		expectClose(fit.sigmaSlope, Math.sqrt(0.07), { abs: 1e-12 }, 'σ slope');
		expectClose(fit.sigmaIntercept, Math.sqrt(0.245), { abs: 1e-12 }, 'σ intercept');
	});
	it('has no standard error from two points and refuses a constant x', () => {
		expect(Number.isNaN(linearFit([0, 1], [3, 5]).sigmaSlope)).toBe(true);
		expect(thrown(() => linearFit([2, 2, 2], [1, 2, 3])).field).toBe('x');
	});
});

// An invented log: two units, 0–500 m k = 2 and 500–1000 m k = 3, q = 60 mW/m², T(0) = 12 °C,
// so T = 12 + q R(z) with R = z/2 above 500 m and 250 + (z − 500)/3 below (Bullard 1939).
const conductivity: ConductivityInterval[] = [
	{ topM: 500, bottomM: 1000, conductivityWmK: 3, sigmaWmK: 0.3 },
	{ topM: 0, bottomM: 500, conductivityWmK: 2, sigmaWmK: 0.1 }
];
const depthM = Array.from({ length: 41 }, (_, i) => i * 25);
const resistance = (z: number) => (z <= 500 ? z / 2 : 250 + (z - 500) / 3);
const temperatureC = depthM.map((z) => 12 + 0.06 * resistance(z));

describe('Bullard method (Bullard 1939)', () => {
	it('recovers q and the intercept exactly from a noise-free two-unit log', () => {
		const est = heatFlowFromLog({ depthM, temperatureC, conductivity, method: 'bullard' });
		expectClose(est.heatFlowMWm2, 60, { abs: 1e-9 }, 'q');
		expectClose(est.interceptC, 12, { abs: 1e-9 }, 'T at R = 0');
		expect(est.samples).toBe(41);
		// Harmonic mean over 0–1000 m: 1000/(500/2 + 500/3) = 2.4 W/m/K.
		expectClose(est.meanConductivityWmK, 2.4, { abs: 1e-12 }, 'k̄');
	});

	it('puts R = 0 at the top of the fitted range and reports the points used', () => {
		const est = heatFlowFromLog({
			depthM,
			temperatureC,
			conductivity,
			method: 'bullard',
			fromM: 300,
			toM: 800
		});
		expect(est.samples).toBe(21);
		expectClose(est.interceptC, 12 + 0.06 * 150, { abs: 1e-9 }, 'T(300 m)');
		expectClose(est.heatFlowMWm2, 60, { abs: 1e-9 }, 'q');
		const plot = bullardPlot({ depthM, temperatureC, conductivity, fromM: 300, toM: 800 });
		expectClose(
			plot.thermalResistanceM2KW.at(-1)!,
			resistance(800) - resistance(300),
			{ abs: 1e-12 },
			'R(800)'
		);
	});

	it('combines the slope error with the conductivity error: σq/q = √((σΓ/Γ)² + (σk/k)²) (Taylor 1997 ch. 3)', () => {
		// Noise-free data: only the conductivity term is left. σR² = (500·0.1/4)² + (500·0.3/9)², R = 416.67.
		const est = heatFlowFromLog({ depthM, temperatureC, conductivity, method: 'bullard' });
		const sigmaR = Math.hypot((500 * 0.1) / 4, (500 * 0.3) / 9);
		expectClose(est.sigmaMWm2 / est.heatFlowMWm2, sigmaR / (250 + 500 / 3), { rel: 1e-9 }, 'σq/q');
	});
});

describe('interval method: q = k̄ Γ (harmonic mean of layers in series; common practice, no source)', () => {
	it('recovers q inside one unit and its least-squares gradient (30 K/km for k = 2)', () => {
		const est = heatFlowFromLog({
			depthM,
			temperatureC,
			conductivity,
			method: 'interval',
			toM: 500
		});
		expectClose(est.gradientKPerKm, 30, { abs: 1e-9 }, 'Γ');
		expectClose(est.heatFlowMWm2, 60, { abs: 1e-9 }, 'q');
		expectClose(est.sigmaGradientKPerKm, 0, { abs: 1e-9 }, 'σΓ');
		expectClose(est.sigmaMWm2, 60 * (0.1 / 2), { rel: 1e-9 }, 'σq from σk/k = 5 %');
		expectClose(est.interceptC, 12, { abs: 1e-9 }, 'intercept at the top');
	});

	it('adds the slope standard error in quadrature with the conductivity term', () => {
		// Alternating ±0.05 °C noise on one unit; σΓ comes from the regression, σk/k = 0.05.
		const noisy = temperatureC.map((t, i) => t + (i % 2 ? 0.05 : -0.05));
		const est = heatFlowFromLog({
			depthM,
			temperatureC: noisy,
			conductivity,
			method: 'interval',
			toM: 500
		});
		const g = temperatureGradient({ depthM, temperatureC: noisy, toM: 500 });
		const relG = g.sigmaGradientKPerKm / g.gradientKPerKm;
		expect(relG).toBeGreaterThan(0);
		expectClose(est.sigmaMWm2 / est.heatFlowMWm2, Math.hypot(relG, 0.05), { rel: 1e-9 }, 'σq/q');
	});
});

describe('bad logs', () => {
	const base = { depthM, temperatureC, conductivity, method: 'bullard' as const };
	it.each([
		['fewer than 3 points in range', { ...base, fromM: 100, toM: 140 }, 'fromM/toM'],
		[
			'non-increasing depths',
			{ ...base, depthM: [0, 10, 10, 20], temperatureC: [1, 2, 3, 4] },
			'depthM[2]'
		],
		[
			'NaN temperature',
			{ ...base, temperatureC: temperatureC.map((t, i) => (i === 5 ? NaN : t)) },
			'temperatureC[5]'
		],
		['length mismatch', { ...base, temperatureC: temperatureC.slice(1) }, 'temperatureC'],
		[
			'gap in conductivity',
			{ ...base, conductivity: [conductivity[1], { ...conductivity[0], topM: 600 }] },
			'conductivity'
		],
		[
			'conductivity not reaching the bottom',
			{ ...base, conductivity: [conductivity[1]] },
			'conductivity'
		],
		[
			'overlapping intervals',
			{ ...base, conductivity: [conductivity[1], { ...conductivity[0], topM: 400 }] },
			'conductivity'
		],
		[
			'zero conductivity',
			{ ...base, conductivity: [conductivity[1], { ...conductivity[0], conductivityWmK: 0 }] },
			'conductivity[1].conductivityWmK'
		],
		['unknown method', { ...base, method: 'magic' as 'bullard' }, 'method']
	])('throws a InputError: %s', (_, input, field) => {
		const e = thrown(() => heatFlowFromLog(input));
		expect(e).toBeInstanceOf(InputError);
		expect(e.field).toBe(field);
		expect(e.message).toContain(field);
	});
});

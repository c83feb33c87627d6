import { describe, expect, it } from 'vitest';
import {
	brittleDuctileDepthM,
	heatFlowAtDepthMWm2,
	heatFlowProvinceFit,
	heatFlowSplit,
	isothermDepthM,
	lithosphereBase,
	mohoTemperatureC,
	temperatureAtDepthC
} from './derived';
import { solveGeotherm } from './geotherm';
import type { GeothermProfile } from './types';
import { expectClose, thrown } from '../foundation/testing';

// A tiny hand-made profile (not from the solver) for interpolation and crossing rules.
const handMade: GeothermProfile = {
	depthM: [0, 1000, 2000, 3000],
	temperatureC: [10, 40, 30, 90],
	heatFlowMWm2: [60, 50, 40, 30],
	surfaceHeatFlowMWm2: 60,
	basalHeatFlowMWm2: 30
};

describe('temperature and heat flow at depth (linear between samples; common practice, no source)', () => {
	it('interpolates linearly and returns samples exactly', () => {
		expect(temperatureAtDepthC(handMade, 0)).toBe(10);
		expect(temperatureAtDepthC(handMade, 3000)).toBe(90);
		expectClose(temperatureAtDepthC(handMade, 250), 17.5, { abs: 1e-12 }, 'T(250)');
		expectClose(temperatureAtDepthC(handMade, 2500), 60, { abs: 1e-12 }, 'T(2500)');
		expectClose(heatFlowAtDepthMWm2(handMade, 1500), 45, { abs: 1e-12 }, 'q(1500)');
	});

	it('throws outside the profile and on NaN', () => {
		expect(thrown(() => temperatureAtDepthC(handMade, -1)).field).toBe('depthM');
		expect(thrown(() => temperatureAtDepthC(handMade, 3000.5)).message).toContain('3000.5');
		expect(thrown(() => temperatureAtDepthC(handMade, NaN)).field).toBe('depthM');
	});

	it('recovers the worked value of docs/science.md#steady-conduction between samples of a coarse profile only approximately', () => {
		// Worked check (Turcotte & Schubert ch. 4): 230 °C at 10 km; with a 100 m step the chord error
		// is A h²/(8k) = 5e-4 °C at most, so 10 km (a sample) is exact and 9950 m is 5e-4 low.
		const p = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 60,
			layers: [{ thicknessM: 12_000, conductivityWmK: 2.5, heatProductionUWm3: 1 }]
		});
		expectClose(temperatureAtDepthC(p, 10_000), 230, { abs: 1e-9 }, 'T(10 km)');
		const exact = 10 + (0.06 * 9950) / 2.5 - (1e-6 * 9950 ** 2) / 5;
		// Midway the chord error equals the bound; the concave curve lies above its chord.
		expectClose(temperatureAtDepthC(p, 9950), exact - 5e-4, { abs: 1e-9 }, 'T(9950)');
	});
});

describe('isotherms (first crossing, linear between samples: docs/science.md#derived-quantities)', () => {
	it('finds the first crossing, linear between samples, and null when never reached', () => {
		expectClose(
			isothermDepthM(handMade, 35)!,
			5000 / 6,
			{ abs: 1e-9 },
			'35 °C first on the way up'
		);
		expectClose(isothermDepthM(handMade, 60)!, 2500, { abs: 1e-9 }, '60 °C');
		expect(isothermDepthM(handMade, 10)).toBe(0);
		expect(isothermDepthM(handMade, 95)).toBeNull();
		expect(isothermDepthM(handMade, 5)).toBeNull();
	});

	it('puts the 230 °C isotherm of the worked example at 10 km and 300 °C where the quadratic says', () => {
		const p = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 60,
			depthStepM: 10,
			layers: [{ thicknessM: 20_000, conductivityWmK: 2.5, heatProductionUWm3: 1 }]
		});
		expectClose(isothermDepthM(p, 230)!, 10_000, { abs: 1e-6 }, '230 °C');
		// 10 + 0.024 z − 2e-7 z² = 300 → z = (0.024 − √(0.024² − 4·2e-7·290))/(4e-7).
		const z300 = (0.024 - Math.sqrt(0.024 ** 2 - 4 * 2e-7 * 290)) / 4e-7;
		expectClose(brittleDuctileDepthM(p)!, z300, { abs: 0.01 }, '300 °C');
	});
});

describe('Moho temperature and heat-flow split (Turcotte & Schubert ch. 4; Chapman 1986)', () => {
	const p = solveGeotherm({
		surfaceTemperatureC: 10,
		surfaceHeatFlowMWm2: 70,
		depthStepM: 1000,
		layers: [
			{ thicknessM: 10_000, conductivityWmK: 3, heatProductionUWm3: 2 },
			{ thicknessM: 20_000, conductivityWmK: 2, heatProductionUWm3: 0.5 },
			{ thicknessM: 70_000, conductivityWmK: 3.5, heatProductionUWm3: 0 }
		]
	});
	it('reads the Moho temperature at a given depth (hand value 660 °C at 30 km, see geotherm.spec.ts)', () => {
		expectClose(mohoTemperatureC(p, 30_000), 660, { abs: 1e-9 }, 'T_Moho');
		expect(mohoTemperatureC(p)).toBe(p.temperatureC.at(-1));
	});
	it('splits surface heat flow into crustal production (2·10 + 0.5·20 = 30 mW/m²) and heat flow from below (40)', () => {
		const split = heatFlowSplit(p, 30_000);
		expectClose(split.heatFlowBelowMWm2, 40, { abs: 1e-9 }, 'from below');
		expectClose(split.producedHeatFlowMWm2, 30, { abs: 1e-9 }, 'produced');
		expectClose(split.producedFraction, 3 / 7, { abs: 1e-12 }, 'fraction');
		expectClose(
			heatFlowSplit(p).heatFlowBelowMWm2,
			40,
			{ abs: 1e-9 },
			'at base (no production below 30 km)'
		);
	});
});

describe('thermal lithosphere base (adiabat Tp + g z; defaults common practice, from memory)', () => {
	// A = 0, k = 2, q = 20 mW/m²: T = 10 K/km · z exactly; meets 1330 + 0.4 K/km·z at z = 1330/9.6 km.
	const p = solveGeotherm({
		surfaceTemperatureC: 0,
		surfaceHeatFlowMWm2: 20,
		depthStepM: 1000,
		layers: [{ thicknessM: 200_000, conductivityWmK: 2, heatProductionUWm3: 0 }]
	});
	it('finds the intersection with the default adiabat', () => {
		const base = lithosphereBase(p)!;
		expectClose(base.depthM, (1330 / 9.6) * 1000, { abs: 1e-6 }, 'depth');
		expectClose(base.temperatureC, 1330 + 0.4 * (1330 / 9.6), { abs: 1e-6 }, 'T');
	});
	it('takes the adiabat as parameters and returns null when the profile never reaches it', () => {
		const base = lithosphereBase(p, { potentialTemperatureC: 1300, gradientKPerKm: 0.5 })!;
		expectClose(base.depthM, (1300 / 9.5) * 1000, { abs: 1e-6 }, 'depth');
		const shallow = solveGeotherm({
			surfaceTemperatureC: 0,
			surfaceHeatFlowMWm2: 20,
			layers: [{ thicknessM: 100_000, conductivityWmK: 2, heatProductionUWm3: 0 }]
		});
		expect(lithosphereBase(shallow)).toBeNull();
	});
});

describe('heat-flow province fit q0 = qr + D A0 (Lachenbruch 1970)', () => {
	it('recovers qr and D from exact synthetic sites (invented: qr = 30 mW/m², D = 10 km)', () => {
		const sites = [0.5, 1, 2, 3.5, 5].map((a) => ({
			heatProductionUWm3: a,
			heatFlowMWm2: 30 + 10 * a
		}));
		const fit = heatFlowProvinceFit(sites);
		expectClose(fit.reducedHeatFlowMWm2, 30, { abs: 1e-9 }, 'qr');
		expectClose(fit.characteristicDepthM, 10_000, { abs: 1e-6 }, 'D');
		expectClose(fit.sigmaCharacteristicDepthM, 0, { abs: 1e-6 }, 'σD');
		expect(thrown(() => heatFlowProvinceFit(sites.slice(0, 2))).field).toBe('sites');
	});
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError, temperatureAtDepthC } from '$lib/thermal';
import { computeSiteGeotherm } from './site-geotherm';
import type { GeothermSite } from './site-model';

// Uniform upper crust with the numbers of our own worked check (Turcotte & Schubert, Geodynamics,
// ch. 4: T = T0 + q0 z/k − A z²/(2k)): T0 = 10 °C, q0 = 60 mW/m², k = 2.5 W/m/K, A = 1.0 µW/m³.
const uniformSite: GeothermSite = {
	heatFlowMWm2: 60,
	conductivityWmK: 2.5,
	heatProductionUWm3: 1.0,
	surfaceTemperatureC: 10
};
const uniform = { upperCrustHeatProductionProfile: 'uniform' as const, samples: 400 };

function closedFormC(zM: number): number {
	return 10 + (0.06 * zM) / 2.5 - (1e-6 * zM * zM) / (2 * 2.5);
}

describe('computeSiteGeotherm', () => {
	it('deterministic profile equals the closed form in the upper crust: 230 °C at 10 km (Turcotte & Schubert ch. 4)', () => {
		const g = computeSiteGeotherm(uniformSite, uniform);
		const profile = {
			...g,
			temperatureC: g.deterministicC,
			heatFlowMWm2: [],
			surfaceHeatFlowMWm2: 60,
			basalHeatFlowMWm2: 0
		};
		// By hand: 10 + 0.06·1e4/2.5 − 1e-6·1e8/5 = 10 + 240 − 20 = 230 °C.
		expect(temperatureAtDepthC(profile, 10_000)).toBeCloseTo(230, 9);
		for (const z of [0, 2_500, 5_000, 12_500, 15_000]) {
			expect(temperatureAtDepthC(profile, z)).toBeCloseTo(closedFormC(z), 9);
		}
		expect(g.depthM[1]).toBe(250); // the 250 m grid
		expect(g.depthM.at(-1)).toBe(35_000);
	});

	it('keeps P10 ≤ P50 ≤ P90 at every depth (definition of percentiles, no source)', () => {
		const g = computeSiteGeotherm({ heatFlowMWm2: 65 }, { temperatureDependentConductivity: true });
		expect(g.p10C).toHaveLength(g.depthM.length);
		g.depthM.forEach((_, i) => {
			expect(g.p10C[i]).toBeLessThanOrEqual(g.p50C[i]);
			expect(g.p50C[i]).toBeLessThanOrEqual(g.p90C[i]);
		});
		for (const iso of g.isotherms) {
			if (iso.p10M != null && iso.p50M != null) expect(iso.p10M).toBeLessThanOrEqual(iso.p50M);
			if (iso.p50M != null && iso.p90M != null) expect(iso.p50M).toBeLessThanOrEqual(iso.p90M);
		}
		const m = g.mohoTemperaturePercentilesC;
		expect(m.p10 <= m.p50 && m.p50 <= m.p90).toBe(true);
	});

	it('puts the 150 °C isotherm shallower for a higher heat flow (conduction, common practice, no source)', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 40, max: 120, noNaN: true }),
				fc.double({ min: 1, max: 40, noNaN: true }),
				fc.boolean(),
				(q, dq, kOfT) => {
					const depth = (heatFlowMWm2: number) => {
						const g = computeSiteGeotherm(
							{ heatFlowMWm2 },
							{ samples: 50, temperatureDependentConductivity: kOfT }
						);
						return g.isotherms[0].deterministicM ?? Infinity;
					};
					expect(depth(q + dq)).toBeLessThan(depth(q));
				}
			),
			{ numRuns: 40 }
		);
	});

	it('returns the 150 and 300 °C isotherms first, then the user one, with labels', () => {
		const g = computeSiteGeotherm(uniformSite, { ...uniform, extraIsothermsC: [200, 150] });
		expect(g.isotherms.map((i) => i.temperatureC)).toEqual([150, 300, 200]);
		expect(g.isotherms[0].label).toContain('power generation');
		expect(g.isotherms[1].label).toContain('brittle–ductile');
		// 150 °C in the uniform case solves 10 + 0.024 z − 2e-7 z² = 150: z = (0.024 − √(0.024² − 4·2e-7·140))/(4e-7) = 6 148.4 m (by hand).
		const z150 = (0.024 - Math.sqrt(0.024 ** 2 - 4 * 2e-7 * 140)) / 4e-7;
		expect(z150).toBeCloseTo(6148.35, 1);
		expect(Math.abs((g.isotherms[0].deterministicM as number) - z150)).toBeLessThan(2); // linear between 250 m samples
	});

	it('reports Moho temperature and mantle heat flow consistent with the energy balance (Turcotte & Schubert ch. 4)', () => {
		const g = computeSiteGeotherm(uniformSite, uniform);
		// q_m = q0 − ∫A dz = 60 − (1.0·15 + 0.4·10 + 0.2·10) = 39 mW/m².
		expect(g.mantleHeatFlowMWm2).toBeCloseTo(39, 9);
		expect(g.mohoTemperatureC).toBeCloseTo(g.deterministicC.at(-1) as number, 12);
		expect(g.surfaceHeatFlowMWm2).toBe(60);
	});

	it('warns when an isotherm is not reached and passes on the core warning for negative basal heat flow', () => {
		const cold = computeSiteGeotherm(
			{ heatFlowMWm2: 30, surfaceTemperatureC: 0 },
			{ samples: 200, extraIsothermsC: [900, -5] }
		);
		const text = cold.warnings.join('\n');
		expect(text).toContain('900 °C is not reached above the Moho');
		expect(text).toContain('-5 °C is not above the surface temperature');
		expect(cold.isotherms.find((i) => i.temperatureC === 900)?.deterministicM).toBeNull();
		// 20 mW/m² cannot carry the ~21.5 mW/m² of default crustal heat production.
		const negative = computeSiteGeotherm({ heatFlowMWm2: 20 }, { samples: 200 });
		expect(negative.warnings.join('\n')).toContain('heat flow turns negative at depth');
		expect(negative.mantleHeatFlowMWm2).toBeLessThan(0);
	});

	it('is reproducible with the same seed and differs with another (seeded generator; common practice, no source)', () => {
		const a = computeSiteGeotherm({ heatFlowMWm2: 80 }, { seed: 7 });
		const b = computeSiteGeotherm({ heatFlowMWm2: 80 }, { seed: 7 });
		const c = computeSiteGeotherm({ heatFlowMWm2: 80 }, { seed: 8 });
		expect(b.p90C).toEqual(a.p90C);
		expect(b.isotherms).toEqual(a.isotherms);
		expect(c.p90C).not.toEqual(a.p90C);
		expect(a.samples).toBe(2000);
	});

	it('surfaces InputError messages for bad inputs', () => {
		expect(() => computeSiteGeotherm({ heatFlowMWm2: 60, conductivityWmK: -1 })).toThrow(
			/layers\[0\]\.conductivityWmK must be > 0; got -1/
		);
		expect(() => computeSiteGeotherm({ heatFlowMWm2: 60 }, { extraIsothermsC: [NaN] })).toThrow(
			InputError
		);
	});
});

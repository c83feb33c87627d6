import { describe, expect, it } from 'vitest';
import { InputError } from '$lib/thermal';
import { defaultCrustForSite, SITE_MODEL_DEFAULTS, type GeothermSite } from './site-model';

// Invented example site (not from any data set).
const measured: GeothermSite = {
	heatFlowMWm2: 72,
	heatFlowSigmaMWm2: 5,
	conductivityWmK: 3.1,
	conductivitySigmaWmK: 0.2,
	heatProductionUWm3: 2.6,
	heatProductionSigmaUWm3: 0.3,
	surfaceTemperatureC: 7.5
};
const bare: GeothermSite = { heatFlowMWm2: 60 };

function caught(fn: () => unknown): InputError {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(InputError);
		return e as InputError;
	}
	return expect.fail('expected a InputError');
}

describe('defaultCrustForSite', () => {
	it('uses and lists the defaults when the site gives only heat flow (typical values: common practice, from memory)', () => {
		const m = defaultCrustForSite(bare);
		expect(m.input.surfaceTemperatureC).toBe(10);
		expect(m.input.surfaceHeatFlowMWm2).toBe(60);
		expect(m.input.layers.map((l) => l.thicknessM)).toEqual([15_000, 10_000, 10_000]);
		expect(m.input.layers.map((l) => l.heatProductionUWm3)).toEqual([2.0, 0.4, 0.2]);
		expect(m.input.layers.map((l) => l.conductivityWmK)).toEqual([2.5, 2.4, 2.2]);
		expect(m.input.layers[0].heatProductionDecayM).toBe(10_000);
		expect(m.input.layers[1].heatProductionDecayM).toBeUndefined();
		// 10 % sigmas when none given.
		expect(m.heatFlowSigmaMWm2).toBeCloseTo(6, 12);
		expect(m.layerUncertainty[0].conductivitySigmaWmK).toBeCloseTo(0.25, 12);
		expect(m.layerUncertainty[2].heatProductionSigmaUWm3).toBeCloseTo(0.02, 12);
		const text = m.assumptions.join('\n');
		expect(text).toContain('Surface temperature 10 °C: the site gives none');
		expect(text).toContain('10 % assumed (a typical value)');
		expect(text).toContain('2 µW/m³ (the site gives none; a typical value)');
		expect(text).toContain('2.5 W/m/K (the site gives none; a typical value)');
		expect(text).toContain('Steady state');
		expect(text).toContain('No advection');
		expect(m.mohoDepthM).toBe(35_000);
	});

	it('takes measured site values and their sigmas for the upper crust', () => {
		const m = defaultCrustForSite(measured);
		expect(m.input.surfaceTemperatureC).toBe(7.5);
		expect(m.input.layers[0]).toMatchObject({ conductivityWmK: 3.1, heatProductionUWm3: 2.6 });
		expect(m.heatFlowSigmaMWm2).toBe(5);
		expect(m.layerUncertainty[0]).toEqual({
			conductivitySigmaWmK: 0.2,
			heatProductionSigmaUWm3: 0.3
		});
		expect(m.assumptions.join('\n')).toContain('Surface temperature 7.5 °C (site value)');
	});

	it('lets options override site values and say so', () => {
		const m = defaultCrustForSite(measured, {
			surfaceTemperatureC: 12,
			upperCrustHeatProductionUWm3: 1.2,
			upperCrustHeatProductionProfile: 'uniform',
			temperatureDependentConductivity: true
		});
		expect(m.input.surfaceTemperatureC).toBe(12);
		expect(m.input.layers[0].heatProductionUWm3).toBe(1.2);
		expect(m.input.layers[0].heatProductionDecayM).toBeUndefined();
		// An entered A has no site sigma: the relative default applies.
		expect(m.layerUncertainty[0].heatProductionSigmaUWm3).toBeCloseTo(0.12, 12);
		expect(m.input.layers[0].conductivityTempCoeffPerK).toBeUndefined();
		expect(m.input.layers[1].conductivityTempCoeffPerK).toBe(
			SITE_MODEL_DEFAULTS.conductivityTempCoeffPerK
		);
		const text = m.assumptions.join('\n');
		expect(text).toContain('(entered)');
		expect(text).toContain(', uniform;');
		expect(text).toContain('b = 0.001 per °C, a typical value for crystalline rock');
		expect(text).not.toContain('from memory');
	});

	it('cuts the layers at a shallow Moho and extends the lower crust to a deep one', () => {
		expect(
			defaultCrustForSite(bare, { mohoDepthKm: 20 }).input.layers.map((l) => l.thicknessM)
		).toEqual([15_000, 5_000]);
		expect(
			defaultCrustForSite(bare, { mohoDepthKm: 12 }).input.layers.map((l) => l.thicknessM)
		).toEqual([12_000]);
		expect(
			defaultCrustForSite(bare, { mohoDepthKm: 45 }).input.layers.map((l) => l.thicknessM)
		).toEqual([15_000, 10_000, 20_000]);
	});

	it('throws InputError naming the field for bad values', () => {
		expect(caught(() => defaultCrustForSite(bare, { mohoDepthKm: 0 })).field).toBe('mohoDepthKm');
		expect(caught(() => defaultCrustForSite(bare, { mohoDepthKm: NaN })).message).toContain(
			'finite'
		);
		expect(caught(() => defaultCrustForSite({ heatFlowMWm2: null })).field).toBe('heatFlowMWm2');
		expect(caught(() => defaultCrustForSite({ heatFlowMWm2: -5 })).field).toBe('heatFlowMWm2');
		expect(caught(() => defaultCrustForSite(bare, { surfaceTemperatureC: NaN })).field).toBe(
			'surfaceTemperatureC'
		);
	});

	it('warns for a marine site without a bottom-water temperature (common practice, no source)', () => {
		const m = defaultCrustForSite({ heatFlowMWm2: 55, waterDepthM: 3200 });
		expect(m.assumptions.join('\n')).toContain('below the seafloor (water depth 3200 m)');
		expect(m.warnings.join('\n')).toContain('likely too warm for deep water');
	});
});

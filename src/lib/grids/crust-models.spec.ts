import { describe, expect, it } from 'vitest';
import { defaultCrustForSite } from '../chart-data';
import { isothermDepthM, solveGeotherm, temperatureAtDepthC } from '../thermal';
import { isothermDepthGrid, temperatureAtDepthGrid } from './at-depth';
import {
	atDepthAssumptions,
	CRUST_MODEL_LIST,
	CRUST_MODELS,
	crustBaseM,
	crustModelIdSchema
} from './crust-models';

// For every model the affine shortcut of at-depth.ts must equal solving the geotherm directly for
// each heat flow (steady conduction with constant k is linear in the boundary heat flow: Turcotte
// & Schubert, Geodynamics, ch. 4). Tolerances: 0.01 °C for temperatures (only rounding differs)
// and 1 m for isotherm depths (both interpolate linearly between the same 50 m samples).
describe('crust models', () => {
	const qs = [35, 60, 85, 110];
	for (const model of CRUST_MODEL_LIST) {
		const direct = (q: number) =>
			solveGeotherm({
				surfaceTemperatureC: model.surfaceTemperatureC,
				layers: model.layers,
				surfaceHeatFlowMWm2: q,
				depthStepM: 50
			});
		it(`${model.id}: temperature at depth and isotherm depth equal a direct geotherm`, () => {
			const value = Float32Array.from(qs);
			for (const depthM of [1000, 3000, 7500, 20_000]) {
				const t = temperatureAtDepthGrid(value, null, depthM, model).p50;
				qs.forEach((q, k) =>
					expect(Math.abs(t[k] - temperatureAtDepthC(direct(q), depthM))).toBeLessThan(0.01)
				);
			}
			for (const isothermC of [60, 150, 300]) {
				const d = isothermDepthGrid(value, null, isothermC, model).p50;
				qs.forEach((q, k) => {
					const want = isothermDepthM(direct(q), isothermC);
					if (want === null) expect(d[k]).toBeNaN();
					else expect(Math.abs(d[k] - want)).toBeLessThan(1);
				});
			}
		});
		it(`${model.id}: constant conductivities, a described source, a base depth`, () => {
			expect(model.layers.every((l) => l.conductivityTempCoeffPerK === undefined)).toBe(true);
			expect(model.source).toMatch(/memory|no source/);
			expect(atDepthAssumptions(model)).toContain(model.name);
			expect(crustBaseM(model)).toBeGreaterThan(20_000);
		});
	}

	it('the default is the site model’s crust, so grids keep their former values', () => {
		expect(CRUST_MODELS.continental.layers).toEqual(
			defaultCrustForSite({ heatFlowMWm2: 60 }).input.layers
		);
	});

	it('the models give different temperatures for the same heat flow', () => {
		const at3km = CRUST_MODEL_LIST.map(
			(m) => temperatureAtDepthGrid(Float32Array.from([70]), null, 3000, m).p50[0]
		);
		expect(new Set(at3km.map((t) => t.toFixed(1))).size).toBe(CRUST_MODEL_LIST.length);
		// Less conductive sediment is hotter at 3 km than the crystalline crust below the same q0.
		expect(at3km[CRUST_MODEL_LIST.findIndex((m) => m.id === 'basin')]).toBeGreaterThan(
			at3km[CRUST_MODEL_LIST.findIndex((m) => m.id === 'continental')]
		);
	});

	it('refuses an unknown id with a sentence', () => {
		const r = crustModelIdSchema.safeParse('mantle');
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toMatch(/crust must be one of continental/);
	});
});

import { describe, expect, it } from 'vitest';
import { defaultCrustForSite } from '../chart-data';
import { isothermDepthM, solveGeotherm, temperatureAtDepthC } from '../thermal';
import { isothermDepthGrid, temperatureAtDepthGrid } from './at-depth';

// The affine shortcut must equal solving the geotherm for each cell (thermal core, closed forms;
// linearity of steady conduction with constant k: Turcotte & Schubert, Geodynamics, ch. 4).
const direct = (q: number) =>
	solveGeotherm({ ...defaultCrustForSite({ heatFlowMWm2: q }).input, depthStepM: 50 });

describe('at-depth grids', () => {
	const value = Float32Array.from([45, 70, 95, NaN]);
	const sigma = Float32Array.from([5, 8, 10, NaN]);
	it('temperature at 3 km equals a direct geotherm per cell; P10 < P50 < P90', () => {
		const t = temperatureAtDepthGrid(value, sigma, 3000);
		for (let c = 0; c < 3; c++) {
			expect(t.p50[c]).toBeCloseTo(temperatureAtDepthC(direct(value[c]), 3000), 2);
			expect(t.p10[c]).toBeLessThan(t.p50[c]);
			expect(t.p90[c]).toBeGreaterThan(t.p50[c]);
			expect(t.p90[c]).toBeCloseTo(
				temperatureAtDepthC(direct(value[c] + 1.2815515655 * sigma[c]), 3000),
				2
			);
		}
		expect(Number.isNaN(t.p50[3])).toBe(true);
	});
	it('depth of 150 °C equals a direct geotherm per cell; hotter is shallower', () => {
		const d = isothermDepthGrid(value, sigma, 150);
		for (let c = 0; c < 3; c++) {
			expect(d.p50[c]).toBeCloseTo(isothermDepthM(direct(value[c]), 150)!, -1);
			expect(d.p10[c]).toBeLessThan(d.p50[c]);
			expect(d.p90[c]).toBeGreaterThan(d.p50[c]);
		}
		expect(d.p50[2]).toBeLessThan(d.p50[0]);
	});
});

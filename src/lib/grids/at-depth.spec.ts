import { describe, expect, it } from 'vitest';
import { defaultCrustForSite } from '../chart-data';
import { isothermDepthM, solveGeotherm, temperatureAtDepthC } from '../thermal';
import { firstCrossingM } from '../thermal/derived';
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
	it('the search for the isotherm gives what walking down each affine profile gives', () => {
		const a = direct(60);
		const b = direct(100);
		const walk = (q: number, tc: number) => {
			const t = a.temperatureC.map((ta, k) => ta + ((q - 60) * (b.temperatureC[k] - ta)) / 40);
			return firstCrossingM(a.depthM, t, tc) ?? NaN;
		};
		const qs = Float32Array.from({ length: 60 }, (_, k) => 15 + k * 2.7);
		for (const tc of [20, 100, 150, 400, 700, 1000]) {
			const d = isothermDepthGrid(qs, null, tc).p50;
			qs.forEach((q, k) => {
				const w = walk(q, tc);
				if (Number.isNaN(w)) expect(d[k]).toBeNaN();
				else expect(d[k]).toBeCloseTo(w, 0);
			});
		}
		// Some isotherms are deeper than the crust for the coolest cells: not reached.
		expect(Array.from(isothermDepthGrid(qs, null, 1000).p50).some(Number.isNaN)).toBe(true);
	});
});

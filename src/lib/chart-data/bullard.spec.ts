import { describe, expect, it } from 'vitest';
import { bullardChartData, type BoreholeLogInput } from './bullard';

// Invented log built to be exactly linear in thermal resistance: k = 2.0 W/m/K above 500 m and
// 4.0 below, q = 80 mW/m², T = 15 °C at 100 m. R(z) from 100 m: (z − 100)/2 above 500 m,
// 200 + (z − 500)/4 below; so R(1000 m) = 325 m²K/W and T(1000 m) = 15 + 0.08·325 = 41 °C.
const depthM = [100, 200, 300, 400, 500, 600, 700, 800, 900, 1000];
const rM2KW = (z: number) => (z <= 500 ? (z - 100) / 2 : 200 + (z - 500) / 4);
const linearLog: BoreholeLogInput = {
	depthM,
	temperatureC: depthM.map((z) => 15 + 0.08 * rM2KW(z)),
	conductivity: [
		{ topM: 0, bottomM: 500, conductivityWmK: 2.0 },
		{ topM: 500, bottomM: 1100, conductivityWmK: 4.0 }
	]
};

describe('bullardChartData', () => {
	it('resistance mode: slope is the heat flow, line from (0, 15 °C) to (325 m²K/W, 41 °C) (Bullard 1939; invented log)', () => {
		const d = bullardChartData(linearLog, 'resistance');
		expect(d.positions).toHaveLength(10);
		expect(d.positions[9]).toBeCloseTo(325, 9);
		expect(d.estimate.heatFlowMWm2).toBeCloseTo(80, 9);
		expect(d.line.fromPosition).toBe(0);
		expect(d.line.fromC).toBeCloseTo(15, 9);
		expect(d.line.toPosition).toBeCloseTo(325, 9);
		expect(d.line.toC).toBeCloseTo(41, 9);
	});

	it('depth mode: line is the least-squares gradient over the used points (common practice, no source)', () => {
		const d = bullardChartData(linearLog, 'depth');
		expect(d.positions).toEqual(depthM);
		expect(d.line.fromPosition).toBe(100);
		expect(d.line.toPosition).toBe(1000);
		// Least squares passes through the centroid (550 m, mean T).
		const meanT = linearLog.temperatureC.reduce((a, b) => a + b, 0) / 10;
		expect((d.line.fromC + d.line.toC) / 2).toBeCloseTo(meanT, 9);
		expect(d.line.toC).toBeGreaterThan(d.line.fromC);
	});

	it('windows the log with fromM/toM and rejects fewer than 3 points (thermal core rules)', () => {
		expect(
			bullardChartData({ ...linearLog, fromM: 300, toM: 700 }, 'resistance').positions
		).toHaveLength(5);
		expect(() => bullardChartData({ ...linearLog, fromM: 900 }, 'resistance')).toThrow(
			/at least 3 log points/
		);
	});
});

describe('bullardChartData residuals', () => {
	it('are zero on a log exactly linear in resistance and measured − fitted otherwise', () => {
		const exact = bullardChartData(linearLog, 'resistance');
		for (const r of exact.residualsC) expect(Math.abs(r)).toBeLessThan(1e-9);
		// Add +0.2 / −0.2 °C to the 2nd and 3rd points: residuals sum to zero (least squares with an
		// intercept) and the perturbed points keep their sign (common practice, no source).
		const noisy = {
			...linearLog,
			temperatureC: linearLog.temperatureC.map((t, i) => t + (i === 1 ? 0.2 : i === 2 ? -0.2 : 0))
		};
		const d = bullardChartData(noisy, 'resistance');
		expect(d.residualsC).toHaveLength(10);
		expect(Math.abs(d.residualsC.reduce((a, b) => a + b, 0))).toBeLessThan(1e-9);
		expect(d.residualsC[1]).toBeGreaterThan(0.1);
		expect(d.residualsC[2]).toBeLessThan(-0.1);
		// Each residual is the point minus the line through its ends at that position.
		const slope = (d.line.toC - d.line.fromC) / (d.line.toPosition - d.line.fromPosition);
		const fitted4 = d.line.fromC + slope * (d.positions[4] - d.line.fromPosition);
		expect(d.residualsC[4]).toBeCloseTo(noisy.temperatureC[4] - fitted4, 12);
	});
});

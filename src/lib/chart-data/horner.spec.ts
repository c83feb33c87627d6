import { describe, expect, it } from 'vitest';
import { hornerChartData } from './horner';
import { expectClose, thrown } from '../foundation/testing';

// Invented readings on an exact Horner line T = 120 − 10 ln((tc + Δt)/Δt) with tc = 4 h
// (Horner 1951; docs/science.md#borehole-heat-flow): Δt = 4, 8, 16 h give ratios 2, 1.5, 1.25.
const tc = 4;
const readings = [4, 8, 16].map((dt) => ({
	shutInTimeH: dt,
	temperatureC: 120 - 10 * Math.log((tc + dt) / dt)
}));

describe('Horner plot view model', () => {
	it('places each reading at ln of its Horner ratio and draws the fit down to ratio 1', () => {
		const d = hornerChartData(readings, tc);
		expect(d.points.map((p) => p.ratio)).toEqual([2, 1.5, 1.25]);
		expectClose(d.points[0].lnRatio, Math.log(2), { abs: 1e-12 }, 'ln 2');
		expectClose(d.line.fromC, 120, { abs: 1e-9 }, 'formation temperature at ratio 1');
		expect(d.line.fromLn).toBe(0);
		expectClose(d.line.toLn, Math.log(2), { abs: 1e-12 }, 'line end');
		expectClose(d.line.toC, 120 - 10 * Math.log(2), { abs: 1e-9 }, 'line end temperature');
		expectClose(d.estimate.formationTemperatureC, 120, { abs: 1e-9 }, 'T∞');
		expectClose(d.estimate.sigmaFormationTemperatureC ?? NaN, 0, { abs: 1e-9 }, 'σT∞');
	});

	it('ticks the ratio axis at 1, 2, 5 × 10ⁿ up to the largest ratio', () => {
		const d = hornerChartData(
			[
				{ shutInTimeH: 0.5, temperatureC: 90 },
				{ shutInTimeH: 2, temperatureC: 100 },
				{ shutInTimeH: 6, temperatureC: 108 }
			],
			12
		);
		// Largest ratio (12 + 0.5)/0.5 = 25.
		expect(d.ratioTicks.map((t) => t.ratio)).toEqual([1, 2, 5, 10, 20]);
		expect(d.ratioTicks[0].lnRatio).toBe(0);
	});

	it('passes the core’s input errors on, naming the field', () => {
		expect(thrown(() => hornerChartData([readings[0]], tc)).field).toBe('readings');
		expect(
			thrown(() => hornerChartData([readings[0], { shutInTimeH: 0, temperatureC: 1 }], tc)).field
		).toBe('readings[1].shutInTimeH');
	});
});

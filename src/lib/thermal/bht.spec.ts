import { describe, expect, it } from 'vitest';
import { hornerFormationTemperature } from './bht';
import { expectClose, thrown } from '../foundation/testing';

// Invented logging run: T∞ = 120 °C, m = 15 °C, circulation 5 h; T(Δt) = T∞ − m ln((tc + Δt)/Δt)
// (Horner 1951; Dowdle & Cobb 1975).
const horner = (dt: number) => 120 - 15 * Math.log((5 + dt) / dt);

describe('Horner BHT extrapolation', () => {
	it('recovers T∞ and m from three exact readings, with a zero standard error', () => {
		const est = hornerFormationTemperature(
			[6, 12, 18].map((dt) => ({ temperatureC: horner(dt), shutInTimeH: dt })),
			5
		);
		expectClose(est.formationTemperatureC, 120, { abs: 1e-9 }, 'T∞');
		expectClose(est.slopeC, 15, { abs: 1e-9 }, 'm');
		expectClose(est.sigmaFormationTemperatureC!, 0, { abs: 1e-9 }, 'σ');
		expect(est.warnings).toEqual([]);
	});

	it('fits two readings exactly but gives no standard error', () => {
		const est = hornerFormationTemperature([
			{ temperatureC: horner(4), shutInTimeH: 4, circulationTimeH: 5 },
			{ temperatureC: horner(10), shutInTimeH: 10, circulationTimeH: 5 }
		]);
		expectClose(est.formationTemperatureC, 120, { abs: 1e-9 }, 'T∞');
		expect(est.sigmaFormationTemperatureC).toBeNull();
	});

	it('gives the regression intercept error with noisy readings (hand check via x = ln((tc+Δt)/Δt))', () => {
		const dts = [3, 6, 9, 15];
		const noise = [0.4, -0.3, -0.2, 0.1];
		const est = hornerFormationTemperature(
			dts.map((dt, i) => ({ temperatureC: horner(dt) + noise[i], shutInTimeH: dt })),
			5
		);
		const x = dts.map((dt) => Math.log((5 + dt) / dt));
		const mx = x.reduce((a, b) => a + b) / 4;
		const sxx = x.reduce((a, v) => a + (v - mx) ** 2, 0);
		const y = dts.map((dt, i) => horner(dt) + noise[i]);
		const my = y.reduce((a, b) => a + b) / 4;
		const slope = x.reduce((a, v, i) => a + (v - mx) * (y[i] - my), 0) / sxx;
		const ssr = y.reduce((a, v, i) => a + (v - (my + slope * (x[i] - mx))) ** 2, 0);
		const sigma = Math.sqrt((ssr / 2) * (1 / 4 + (mx * mx) / sxx));
		expectClose(est.sigmaFormationTemperatureC!, sigma, { rel: 1e-9 }, 'σ T∞');
		expect(Math.abs(est.formationTemperatureC - 120)).toBeLessThan(3 * sigma);
	});

	it('warns when readings cool with shut-in time and rejects bad readings', () => {
		const est = hornerFormationTemperature(
			[
				{ temperatureC: 90, shutInTimeH: 2 },
				{ temperatureC: 85, shutInTimeH: 8 }
			],
			5
		);
		expect(est.warnings.length).toBe(1);
		expect(
			thrown(() => hornerFormationTemperature([{ temperatureC: 90, shutInTimeH: 2 }], 5)).field
		).toBe('readings');
		expect(
			thrown(() =>
				hornerFormationTemperature(
					[
						{ temperatureC: 90, shutInTimeH: 0 },
						{ temperatureC: 95, shutInTimeH: 4 }
					],
					5
				)
			).field
		).toBe('readings[0].shutInTimeH');
		expect(
			thrown(() =>
				hornerFormationTemperature([
					{ temperatureC: 90, shutInTimeH: 1 },
					{ temperatureC: 95, shutInTimeH: 4 }
				])
			).field
		).toBe('readings[0].circulationTimeH');
		expect(
			thrown(() =>
				hornerFormationTemperature(
					[
						{ temperatureC: 90, shutInTimeH: 4 },
						{ temperatureC: 95, shutInTimeH: 4 }
					],
					5
				)
			).field
		).toBe('readings');
	});
});

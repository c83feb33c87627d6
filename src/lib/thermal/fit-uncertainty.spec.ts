import { describe, expect, it } from 'vitest';
import { heatFlowFromLog } from './borehole';
import { expectClose } from '../foundation/testing';

/*
 * The ± of a log-derived heat flow, checked against a case worked by hand with the published
 * formulas (docs/science.md#borehole-heat-flow):
 * - slope error of an unweighted least-squares line with the common σ estimated from the scatter,
 *   σ_b² = N s² / Δ, Δ = N Σx² − (Σx)², s² = Σ(y − a − b x)² / (N − 2)
 *   (Bevington & Robinson 2003, Data Reduction and Error Analysis for the Physical Sciences,
 *   3rd ed., ch. 6, least-squares fit to a straight line);
 * - propagation of independent errors through a product q = k Γ,
 *   σ_q² = (k σ_Γ)² + (Γ σ_k)² (Bevington & Robinson 2003, ch. 3).
 *
 * Log: z = 0, 100, 200, 300 m; T = 10.0, 13.1, 15.9, 19.0 °C; one unit k = 2.0 ± 0.1 W/(m·K).
 * Σx = 600, Σx² = 140 000, Δ = 4·140 000 − 600² = 200 000; Sxy = 1490, Sxx = 50 000,
 * b = 0.0298 K/m, a = 14.5 − 0.0298·150 = 10.03 °C; residuals −0.03, 0.09, −0.09, 0.03,
 * Σr² = 0.018, s² = 0.009, σ_b² = 4·0.009/200 000 = 1.8·10⁻⁷, σ_b = 4.2426·10⁻⁴ K/m.
 * q = 2.0·0.0298 = 0.0596 W/m² = 59.6 mW/m²;
 * σ_q = √((2.0·4.2426·10⁻⁴)² + (0.0298·0.1)²) = √(7.2·10⁻⁷ + 8.8804·10⁻⁶) = 3.0985·10⁻³ W/m².
 * Without the conductivity term it would be 0.8485 mW/m².
 */
const depthM = [0, 100, 200, 300];
const temperatureC = [10.0, 13.1, 15.9, 19.0];
const conductivity = [{ topM: 0, bottomM: 300, conductivityWmK: 2.0, sigmaWmK: 0.1 }];
const HAND_SIGMA_MWM2 = Math.sqrt(7.2e-7 + 8.8804e-6) * 1000;

describe('uncertainty of a fitted heat flow (Bevington & Robinson 2003, ch. 3 and 6)', () => {
	it('interval method: slope error and conductivity error in quadrature, as worked by hand', () => {
		const est = heatFlowFromLog({ depthM, temperatureC, conductivity, method: 'interval' });
		expectClose(est.gradientKPerKm, 29.8, { abs: 1e-9 }, 'gradient K/km');
		expectClose(est.sigmaGradientKPerKm, Math.sqrt(1.8e-7) * 1000, { rel: 1e-9 }, 'σ gradient');
		expectClose(est.heatFlowMWm2, 59.6, { abs: 1e-9 }, 'q');
		expectClose(est.sigmaMWm2, HAND_SIGMA_MWM2, { rel: 1e-9 }, 'σq');
		expectClose(est.sigmaMeanConductivityWmK, 0.1, { rel: 1e-9 }, 'σk̄');
		// The conductivity term dominates here: leaving it out would give 0.85 mW/m².
		expect(est.sigmaMWm2).toBeGreaterThan(3);
	});

	it('Bullard method on one unit gives the same q and σq (R = z/k, slope of T on R = k Γ)', () => {
		const est = heatFlowFromLog({ depthM, temperatureC, conductivity, method: 'bullard' });
		expectClose(est.heatFlowMWm2, 59.6, { abs: 1e-9 }, 'q');
		expectClose(est.sigmaMWm2, HAND_SIGMA_MWM2, { rel: 1e-9 }, 'σq');
	});

	it('samples without σ add no conductivity term (only the slope error is left)', () => {
		const est = heatFlowFromLog({
			depthM,
			temperatureC,
			conductivity: [{ topM: 0, bottomM: 300, conductivityWmK: 2.0 }],
			method: 'interval'
		});
		expectClose(est.sigmaMWm2, 2 * Math.sqrt(1.8e-7) * 1000, { rel: 1e-9 }, 'σq');
		expect(est.sigmaMeanConductivityWmK).toBe(0);
	});
});

// Radiogenic heat production from U, Th and K concentrations (Rybach 1988, in Haenel, Rybach &
// Stegena, Handbook of Terrestrial Heat-Flow Density Determination):
// A = 1e-5 ρ (9.52 C_U + 2.56 C_Th + 3.48 C_K) µW/m³, ρ in kg/m³, U and Th in ppm, K in weight-%.

import { requireInRange, requireNonNegative, requirePositive } from '../foundation/validate';

/** Heat production (µW/m³) from density (kg/m³), U and Th (ppm) and K (weight-%). */
export function heatProductionUWm3(r: {
	densityKgM3: number;
	uraniumPpm: number;
	thoriumPpm: number;
	potassiumPct: number;
}): number {
	requirePositive('densityKgM3', r.densityKgM3);
	requireNonNegative('uraniumPpm', r.uraniumPpm);
	requireNonNegative('thoriumPpm', r.thoriumPpm);
	requireInRange('potassiumPct', r.potassiumPct, 0, 100);
	return 1e-5 * r.densityKgM3 * (9.52 * r.uraniumPpm + 2.56 * r.thoriumPpm + 3.48 * r.potassiumPct);
}

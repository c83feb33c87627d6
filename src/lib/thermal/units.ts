// Heat-flow units. 1 HFU = 1 µcal cm⁻² s⁻¹ = 4.184e-6 J / 1e-4 m² / s = 41.84 mW m⁻² exactly,
// from the thermochemical calorie 1 cal = 4.184 J (SCIENCE.md §3).

/** mW/m² in one heat-flow unit (HFU, µcal cm⁻² s⁻¹); exact. */
export const MWM2_PER_HFU = 41.84;

export type HeatFlowUnit = 'mW/m2' | 'W/m2' | 'HFU';

const MWM2_PER_UNIT: Record<HeatFlowUnit, number> = { 'mW/m2': 1, 'W/m2': 1000, HFU: MWM2_PER_HFU };

/** Converts a heat flow between mW/m², W/m² and HFU. */
export function convertHeatFlow(value: number, from: HeatFlowUnit, to: HeatFlowUnit): number {
	if (from === to) return value;
	return (value * MWM2_PER_UNIT[from]) / MWM2_PER_UNIT[to];
}

/** HFU → mW/m². */
export function hfuToMWm2(heatFlowHfu: number): number {
	return heatFlowHfu * MWM2_PER_HFU;
}

/** mW/m² → HFU. */
export function mWm2ToHfu(heatFlowMWm2: number): number {
	return heatFlowMWm2 / MWM2_PER_HFU;
}

/** W/m² → mW/m². */
export function wm2ToMWm2(heatFlowWm2: number): number {
	return heatFlowWm2 * 1000;
}

/** mW/m² → W/m². */
export function mWm2ToWm2(heatFlowMWm2: number): number {
	return heatFlowMWm2 / 1000;
}

/** µW/m³ → W/m³ (heat production). */
export function uWm3ToWm3(heatProductionUWm3: number): number {
	return heatProductionUWm3 * 1e-6;
}

/** K/m → K/km (gradient). */
export function kPerMToKPerKm(gradientKPerM: number): number {
	return gradientKPerM * 1000;
}

/** Seconds in a Julian year (365.25 d), the usual year for geological ages (common practice, no source). */
export const SECONDS_PER_YEAR = 365.25 * 86400;

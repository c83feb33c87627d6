// Plausibility limits that raise warnings (never rejections), with where each comes from.

/** Heat flow above this (mW/m²) outside volcanic areas deserves a warning (SCIENCE.md §5). */
export const MAX_PLAUSIBLE_HEAT_FLOW_MWM2 = 500;
/** Conductivity range for bulk rock, W/m/K (common practice, no source; SCIENCE.md §5: mostly 1.5–4.5). */
export const PLAUSIBLE_CONDUCTIVITY_WMK = { min: 0.5, max: 6 } as const;
/** Heat production above this (µW/m³) is rare even in granites (SCIENCE.md §5: granite about 2–4). */
export const MAX_PLAUSIBLE_HEAT_PRODUCTION_UWM3 = 10;
/** Largest relative mismatch between the gradient and q/k before a warning (common practice, no source). */
export const MAX_GRADIENT_MISMATCH = 0.2;
/** Years before this are implausible for a heat-flow measurement (common practice, no source). */
export const EARLIEST_PLAUSIBLE_YEAR = 1900;

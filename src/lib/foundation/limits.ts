// The one table of plausibility limits and default settings shared by the thermal core, the upload
// checks and the site chart. Limits raise warnings, never rejections; each says where it comes from.

// Plausibility limits (warnings).

/** Surface heat flow above this (mW/m²) is implausible outside volcanic areas (common practice, no source). */
export const MAX_PLAUSIBLE_HEAT_FLOW_MWM2 = 500;
/** Conductivity range for bulk rock, W/m/K; crustal rock is mostly 1.5–4.5 (common practice, no source). */
export const PLAUSIBLE_CONDUCTIVITY_WMK = { min: 0.5, max: 6 } as const;
/** Heat production above this (µW/m³) is rare even in granites, which give about 2–4 (common practice, from memory). */
export const MAX_PLAUSIBLE_HEAT_PRODUCTION_UWM3 = 10;
/** Largest relative mismatch between a stated gradient and q/k before a warning (common practice, no source). */
export const MAX_GRADIENT_MISMATCH = 0.2;
/** Years before this are implausible for a heat-flow measurement (common practice, no source). */
export const EARLIEST_PLAUSIBLE_YEAR = 1900;
/** Deepest Moho accepted (km): the thickest continental crust is well below this (common practice, from memory). */
export const MAX_MOHO_DEPTH_KM = 100;

// Default settings of the thermal solvers (used when a caller gives none).

/** Output depth spacing of solveGeotherm, solveGeothermNumerical and monteCarloGeotherm (m). */
export const SOLVER_OUTPUT_STEP_M = 100;
/** Largest Runge–Kutta step of the numerical solver (m). */
export const SOLVER_INTEGRATION_STEP_M = 100;
/** Monte Carlo samples and seed when monteCarloGeotherm is called without them. */
export const MONTE_CARLO_SAMPLES = 1000;
export const MONTE_CARLO_SEED = 1;

// Settings of the site chart (sized for instant browser plots: a few milliseconds to 35 km).

/** Depth spacing of the site chart's profile and band (m). */
export const SITE_CHART_DEPTH_STEP_M = 250;
/** Monte Carlo samples behind the site chart's P10/P50/P90 band. */
export const SITE_CHART_SAMPLES = 2000;
/** Seed of the site chart's band, so every visitor sees the same band for the same site. */
export const SITE_CHART_SEED = 1;

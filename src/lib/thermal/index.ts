// Public entry point of the thermal computation core: pure TypeScript, no framework, database,
// Node or DOM imports, so it runs in the browser and on the server. Methods and sources:
// docs/science.md.

// InputError is the one error type of all pure modules; re-exported for the thermal API's callers.
export { InputError } from '../foundation/errors';
export type { CrustLayer, GeothermInput, GeothermProfile } from './types';
export { solveGeotherm, prepareGeotherm } from './geotherm';
export type { PreparedGeotherm, PreparedLayer } from './geotherm';
export { solveGeothermNumerical, segmentsFromLayers } from './numerical';
export type { NumericalGeothermInput, NumericalSegment } from './numerical';
export {
	temperatureAtDepthC,
	heatFlowAtDepthMWm2,
	isothermDepthM,
	brittleDuctileDepthM,
	mohoTemperatureC,
	heatFlowSplit,
	lithosphereBase,
	heatFlowProvinceFit,
	BRITTLE_DUCTILE_QUARTZ_C,
	DEFAULT_POTENTIAL_TEMPERATURE_C,
	DEFAULT_ADIABAT_GRADIENT_K_PER_KM
} from './derived';
export type { HeatFlowSplit, AdiabatOptions, HeatFlowProvinceFit } from './derived';
export { monteCarloGeotherm } from './montecarlo';
export type {
	MonteCarloInput,
	MonteCarloBand,
	LayerUncertainty,
	IsothermPercentiles,
	PercentileTriple
} from './montecarlo';
export type { Distribution } from './distributions';
export { uniformTemperatureBand, NORMAL_Z90 } from './propagation';
export type { UniformUncertaintyInput, LinearisedBand } from './propagation';
export { percentilesInPlace } from './percentile';
export { heatFlowFromLog, temperatureGradient, bullardPlot } from './borehole';
export type { HeatFlowFromLogInput, HeatFlowEstimate } from './borehole';
export type { ConductivityInterval } from './intervals';
export { linearFit } from './regression';
export type { LinearFit } from './regression';
export {
	harmonicMeanWmK,
	arithmeticMeanWmK,
	geometricMeanWmK,
	porousRockConductivityWmK,
	matrixConductivityWmK,
	WATER_CONDUCTIVITY_20C_WMK
} from './conductivity';
export { heatProductionUWm3 } from './radiogenic';
export { hornerFormationTemperature } from './bht';
export type { BhtReading, HornerEstimate } from './bht';
export {
	palaeoclimatePerturbationC,
	palaeoclimateGradientPerturbationKPerKm,
	correctLogForPalaeoclimate,
	DEFAULT_DIFFUSIVITY_M2S
} from './palaeoclimate';
export type { SurfaceTemperatureStep } from './palaeoclimate';
export { erf, erfc } from './erfc';

// Public entry point of the thermal computation core: pure TypeScript, no framework, database,
// Node or DOM imports, so it runs in the browser and on the server. See docs/thermal.md.

export { ThermalInputError } from './errors';
export type { CrustLayer, GeothermInput, GeothermProfile } from './types';
export {
	solveGeotherm,
	prepareGeotherm,
	DEFAULT_DEPTH_STEP_M,
	PLAUSIBLE_MAX_HEAT_FLOW_MWM2
} from './geotherm';
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
export { createRandom } from './random';
export type { Random } from './random';
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
export {
	convertHeatFlow,
	hfuToMWm2,
	mWm2ToHfu,
	wm2ToMWm2,
	mWm2ToWm2,
	MWM2_PER_HFU,
	SECONDS_PER_YEAR
} from './units';
export type { HeatFlowUnit } from './units';
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

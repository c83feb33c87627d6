// Site geotherms for the UI: default crust for a site, the chart-ready computation, and the small
// scale / format helpers the SVG components share. Pure TypeScript.

export { defaultCrustForSite, SITE_MODEL_DEFAULTS, MODEL_ASSUMPTIONS } from './site-model';
export type {
	GeothermSite,
	SiteModel,
	SiteModelOptions,
	HeatProductionProfile
} from './site-model';
export { computeSiteGeotherm, POWER_ISOTHERM_C } from './site-geotherm';
export type { SiteGeotherm, SiteGeothermOptions, IsothermResult } from './site-geotherm';
export { linearScale, niceStep, niceCeil, ticks } from './scale';
export type { LinearScale } from './scale';
export { formatDepthRangeKm, formatTriple } from './format';
export { bullardChartData } from './bullard';
export type { BoreholeLogInput, BullardMode, BullardChartData } from './bullard';
export { hornerChartData } from './horner';
export type { HornerChartData, HornerReadingInput } from './horner';
export { palaeoclimateChartData } from './palaeoclimate';
export type { PalaeoclimateChartData } from './palaeoclimate';

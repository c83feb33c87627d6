// Default crustal model for one site: turns the few values a heat-flow site carries (q0, k, A, T0)
// into a GeothermInput for the thermal core plus the Monte Carlo uncertainty spec. Every value the
// site does not give is an assumption; each is listed in words so the UI can show it beside the plot.
// Pure TypeScript: no SvelteKit, DB, Node or DOM imports (runs in the browser for instant plots).

import { InputError } from '$lib/foundation/errors';
import { MAX_MOHO_DEPTH_KM } from '$lib/foundation/limits';
import { requireFinite, requireNonNegative, requirePositive } from '$lib/foundation/validate';
import { kmToM } from '$lib/geo/units';
import type { CrustLayer, GeothermInput, LayerUncertainty } from '$lib/thermal';

/** The site values the geotherm needs (mW/m², W/m/K, µW/m³, °C, m); null = not measured. */
export interface GeothermSite {
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2?: number | null;
	conductivityWmK?: number | null;
	conductivitySigmaWmK?: number | null;
	heatProductionUWm3?: number | null;
	heatProductionSigmaUWm3?: number | null;
	surfaceTemperatureC?: number | null;
	waterDepthM?: number | null; // marine sites: depths in the model are below the seafloor
}

export type HeatProductionProfile = 'exponential' | 'uniform';

/** Overrides of the default model; anything left out falls back to the site, then the defaults. */
export interface SiteModelOptions {
	mohoDepthKm?: number;
	surfaceTemperatureC?: number;
	upperCrustHeatProductionUWm3?: number;
	upperCrustConductivityWmK?: number;
	/** Shape of heat production in the upper crust; default exponential (see DEFAULTS). */
	upperCrustHeatProductionProfile?: HeatProductionProfile;
	heatProductionDecayKm?: number;
	/** k(T) = k0/(1 + bT) in the middle and lower crust; off by default. */
	temperatureDependentConductivity?: boolean;
	/** Relative standard deviation used when the site gives no sigma; default 0.1 (10 %). */
	defaultRelativeSigma?: number;
}

/**
 * The assumed crust. Values are common practice for continental crust, from memory (no source):
 * they are placeholders that make a plot possible, not a regional model.
 */
export const SITE_MODEL_DEFAULTS = {
	surfaceTemperatureC: 10,
	mohoDepthKm: 35,
	upperCrustBaseKm: 15,
	middleCrustBaseKm: 25,
	upperCrustHeatProductionUWm3: 2.0,
	middleCrustHeatProductionUWm3: 0.4,
	lowerCrustHeatProductionUWm3: 0.2,
	upperCrustConductivityWmK: 2.5,
	middleCrustConductivityWmK: 2.4,
	lowerCrustConductivityWmK: 2.2,
	heatProductionDecayKm: 10,
	// Exponential by default: the measured A is a surface value and granitic heat production is
	// usually taken to fall off with depth; a uniform 2 µW/m³ over 15 km would put 30 mW/m² into
	// the upper crust, half of a typical q0.
	upperCrustHeatProductionProfile: 'exponential' as HeatProductionProfile,
	conductivityTempCoeffPerK: 1e-3,
	relativeSigma: 0.1
} as const;

export interface SiteModel {
	input: GeothermInput;
	heatFlowSigmaMWm2: number;
	layerUncertainty: LayerUncertainty[];
	/** Names of the layers, top to bottom (same length as input.layers). */
	layerNames: string[];
	mohoDepthM: number;
	/** Human-readable assumptions for the UI, in the order they matter. */
	assumptions: string[];
	/** Things about this site that make the model doubtful (e.g. marine site with the 10 °C default). */
	warnings: string[];
}

/** The fixed model assumptions, always shown (docs/science.md, "Site geotherm"). */
export const MODEL_ASSUMPTIONS = [
	'Steady state: no transients (recent erosion, burial, climate change or intrusions are ignored).',
	'One-dimensional conduction: horizontal layers, vertical heat flow only, no topography.',
	'No advection: groundwater, hydrothermal or magmatic heat transport is ignored.',
	'Assumed crustal structure: a three-layer continental crust, not a local model.'
];

// Up to `digits` decimals without trailing zeros: 2 → "2", 2.5 → "2.5", 2.567 → "2.57" (digits 2).
const fmt = (v: number, digits = 1) => String(Number(v.toFixed(digits)));

/** Builds the default three-layer crust for a site; throws InputError on bad values. */
export function defaultCrustForSite(site: GeothermSite, options: SiteModelOptions = {}): SiteModel {
	const D = SITE_MODEL_DEFAULTS;
	const assumptions: string[] = [...MODEL_ASSUMPTIONS];
	const warnings: string[] = [];
	const rel = options.defaultRelativeSigma ?? D.relativeSigma;
	requireNonNegative('defaultRelativeSigma', rel);

	if (site.heatFlowMWm2 == null) {
		throw new InputError('heatFlowMWm2', null, 'must be measured to draw a geotherm');
	}
	requirePositive('heatFlowMWm2', site.heatFlowMWm2);
	const q0 = site.heatFlowMWm2;

	const mohoKm = options.mohoDepthKm ?? D.mohoDepthKm;
	requirePositive('mohoDepthKm', mohoKm);
	// A crustal model; the cap also keeps a typo (35000 for 35) from freezing the browser.
	if (mohoKm > MAX_MOHO_DEPTH_KM) {
		throw new InputError('mohoDepthKm', mohoKm, `must be at most ${MAX_MOHO_DEPTH_KM} km`);
	}
	const decayKm = options.heatProductionDecayKm ?? D.heatProductionDecayKm;
	requirePositive('heatProductionDecayKm', decayKm);

	// Surface temperature: option, then site, then 10 °C.
	let t0: number = D.surfaceTemperatureC;
	if (options.surfaceTemperatureC != null) {
		t0 = options.surfaceTemperatureC;
		assumptions.push(`Surface temperature ${fmt(t0)} °C (entered).`);
	} else if (site.surfaceTemperatureC != null) {
		t0 = site.surfaceTemperatureC;
		assumptions.push(`Surface temperature ${fmt(t0)} °C (site value).`);
	} else {
		assumptions.push(
			`Surface temperature ${D.surfaceTemperatureC} °C: the site gives none; a typical value for mid-latitude land sites.`
		);
	}
	requireFinite('surfaceTemperatureC', t0);
	if (site.waterDepthM != null && site.waterDepthM > 0) {
		assumptions.push(
			`Marine site: depths are below the seafloor (water depth ${fmt(site.waterDepthM, 0)} m); the surface temperature is the bottom-water temperature.`
		);
		if (options.surfaceTemperatureC == null && site.surfaceTemperatureC == null) {
			warnings.push(
				'Marine site without a bottom-water temperature: the 10 °C default is likely too warm for deep water; enter a measured value.'
			);
		}
		warnings.push(
			'Marine site: the default crust is continental; oceanic crust is thinner and differs in heat production.'
		);
	}

	// Heat flow and its sigma.
	let sigmaQ = site.heatFlowSigmaMWm2 ?? null;
	if (sigmaQ == null) {
		sigmaQ = Math.abs(q0) * rel;
		assumptions.push(
			`Surface heat flow ${fmt(q0)} mW/m² (site) ± ${fmt(sigmaQ)}: no uncertainty given, ${fmt(rel * 100)} % assumed (a typical value).`
		);
	} else {
		assumptions.push(`Surface heat flow ${fmt(q0)} ± ${fmt(sigmaQ)} mW/m² (site).`);
	}

	// Upper crust heat production and conductivity: option, then site, then default.
	const aUpper = options.upperCrustHeatProductionUWm3 ?? site.heatProductionUWm3 ?? null;
	const a0 = aUpper ?? D.upperCrustHeatProductionUWm3;
	const aSource =
		options.upperCrustHeatProductionUWm3 != null
			? 'entered'
			: site.heatProductionUWm3 != null
				? 'site'
				: 'the site gives none; a typical value';
	const kUpper = options.upperCrustConductivityWmK ?? site.conductivityWmK ?? null;
	const k0 = kUpper ?? D.upperCrustConductivityWmK;
	const kSource =
		options.upperCrustConductivityWmK != null
			? 'entered'
			: site.conductivityWmK != null
				? 'site'
				: 'the site gives none; a typical value';
	const profile = options.upperCrustHeatProductionProfile ?? D.upperCrustHeatProductionProfile;
	const b = options.temperatureDependentConductivity ? D.conductivityTempCoeffPerK : undefined;

	// Layers cut at the Moho: a shallow Moho drops or thins the deeper layers.
	const spec = [
		{
			name: 'Upper crust',
			topKm: 0,
			baseKm: D.upperCrustBaseKm,
			k: k0,
			a: a0,
			decay: profile === 'exponential' ? kmToM(decayKm) : undefined,
			b: undefined as number | undefined
		},
		{
			name: 'Middle crust',
			topKm: D.upperCrustBaseKm,
			baseKm: D.middleCrustBaseKm,
			k: D.middleCrustConductivityWmK,
			a: D.middleCrustHeatProductionUWm3,
			decay: undefined,
			b
		},
		{
			name: 'Lower crust',
			topKm: D.middleCrustBaseKm,
			baseKm: Infinity, // down to the Moho, whatever its depth
			k: D.lowerCrustConductivityWmK,
			a: D.lowerCrustHeatProductionUWm3,
			decay: undefined,
			b
		}
	].filter((l) => l.topKm < mohoKm);

	const layers: CrustLayer[] = spec.map((l) => {
		const layer: CrustLayer = {
			thicknessM: kmToM(Math.min(l.baseKm, mohoKm) - l.topKm),
			conductivityWmK: l.k,
			heatProductionUWm3: l.a
		};
		if (l.decay != null) layer.heatProductionDecayM = l.decay;
		if (l.b != null) layer.conductivityTempCoeffPerK = l.b;
		return layer;
	});
	const layerNames = spec.map((l) => l.name);

	// Sigmas: the site's for the upper crust where given, else the relative default.
	const sigmaK = kUpper != null && kSource === 'site' ? (site.conductivitySigmaWmK ?? null) : null;
	const sigmaA =
		aUpper != null && aSource === 'site' ? (site.heatProductionSigmaUWm3 ?? null) : null;
	const layerUncertainty: LayerUncertainty[] = layers.map((l, i) => ({
		conductivitySigmaWmK: i === 0 && sigmaK != null ? sigmaK : l.conductivityWmK * rel,
		heatProductionSigmaUWm3: i === 0 && sigmaA != null ? sigmaA : l.heatProductionUWm3 * rel
	}));

	const upperBaseKm = Math.min(D.upperCrustBaseKm, mohoKm);
	assumptions.push(
		`Moho at ${fmt(mohoKm)} km${options.mohoDepthKm != null ? ' (entered)' : ' (a typical value for continental crust)'}; the model ends there.`,
		`Upper crust 0–${fmt(upperBaseKm)} km: heat production ${fmt(a0, 2)} µW/m³ (${aSource})` +
			(profile === 'exponential'
				? ` at the surface, decaying exponentially with a ${fmt(decayKm)} km length scale`
				: ', uniform') +
			`; conductivity ${fmt(k0, 2)} W/m/K (${kSource}).`
	);
	if (mohoKm > D.upperCrustBaseKm) {
		assumptions.push(
			`Middle crust ${D.upperCrustBaseKm}–${fmt(Math.min(D.middleCrustBaseKm, mohoKm))} km: ${D.middleCrustHeatProductionUWm3} µW/m³, ${D.middleCrustConductivityWmK} W/m/K (typical values).`
		);
	}
	if (mohoKm > D.middleCrustBaseKm) {
		assumptions.push(
			`Lower crust ${D.middleCrustBaseKm}–${fmt(mohoKm)} km: ${D.lowerCrustHeatProductionUWm3} µW/m³, ${D.lowerCrustConductivityWmK} W/m/K (typical values).`
		);
	}
	assumptions.push(
		b != null
			? `Conductivity of the middle and lower crust falls as the rock warms: k = k0/(1 + b·T) with b = ${b} per °C, a typical value for crystalline rock; the upper crust keeps its measured value.`
			: 'Conductivity constant with temperature (it usually falls with temperature in crystalline rock, so deep temperatures may be underestimated).',
		`Uncertainty: values without a given standard deviation get ${fmt(rel * 100)} % (a typical value); layer thicknesses are fixed.`
	);

	return {
		input: { surfaceTemperatureC: t0, surfaceHeatFlowMWm2: q0, layers },
		heatFlowSigmaMWm2: sigmaQ,
		layerUncertainty,
		layerNames,
		mohoDepthM: kmToM(mohoKm),
		assumptions,
		warnings
	};
}

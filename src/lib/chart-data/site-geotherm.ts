// Everything a geotherm chart needs for one site, from the thermal core: the deterministic profile,
// the seeded Monte Carlo band, isotherm depths, Moho temperature, mantle heat flow and warnings.
// Sized for instant browser plots: 2,000 samples on a 250 m grid to 35 km take a few milliseconds.

import { InputError } from '$lib/foundation/errors';
import {
	SITE_CHART_DEPTH_STEP_M,
	SITE_CHART_SAMPLES,
	SITE_CHART_SEED
} from '$lib/foundation/limits';
import { mToKm } from '$lib/geo/units';
import {
	BRITTLE_DUCTILE_QUARTZ_C,
	heatFlowSplit,
	isothermDepthM,
	monteCarloGeotherm,
	mohoTemperatureC,
	solveGeotherm,
	type PercentileTriple
} from '$lib/thermal';
import { defaultCrustForSite, type GeothermSite, type SiteModelOptions } from './site-model';

/** Isotherm for electricity generation with binary plants, °C (common practice, no source). */
export const POWER_ISOTHERM_C = 150;

export interface SiteGeothermOptions extends SiteModelOptions {
	/** Isotherms beyond 150 and 300 °C (user-chosen). */
	extraIsothermsC?: number[];
	samples?: number;
	seed?: number;
	depthStepM?: number;
}

export interface IsothermResult {
	temperatureC: number;
	label: string;
	/** Depth in the deterministic (central) model; null when not reached above the Moho. */
	deterministicM: number | null;
	/** Depth percentiles over the samples (P10 = shallow); null when that share never reaches it. */
	p10M: number | null;
	p50M: number | null;
	p90M: number | null;
	fractionReached: number;
}

export interface SiteGeotherm {
	depthM: number[];
	p10C: number[];
	p50C: number[];
	p90C: number[];
	deterministicC: number[];
	/** Base of each layer (m), the last one is the Moho. */
	layerBaseDepthsM: number[];
	layerNames: string[];
	mohoDepthM: number;
	isotherms: IsothermResult[];
	mohoTemperatureC: number;
	mohoTemperaturePercentilesC: PercentileTriple;
	surfaceHeatFlowMWm2: number;
	/**
	 * Mantle (basal) heat flow: what enters the crust from below the Moho (central model). Not the
	 * trade's "reduced heat flow", the intercept of the heat-flow / heat-production relation.
	 */
	mantleHeatFlowMWm2: number;
	mantleHeatFlowPercentilesMWm2: PercentileTriple;
	assumptions: string[];
	warnings: string[];
	samples: number;
	seed: number;
}

function isothermLabel(t: number): string {
	if (t === POWER_ISOTHERM_C) return `${t} °C (power generation)`;
	if (t === BRITTLE_DUCTILE_QUARTZ_C) return `${t} °C (brittle–ductile, quartz-rich crust)`;
	return `${t} °C`;
}

/** Runs the default site model through solveGeotherm and monteCarloGeotherm (seeded). */
export function computeSiteGeotherm(
	site: GeothermSite,
	options: SiteGeothermOptions = {}
): SiteGeotherm {
	const model = defaultCrustForSite(site, options);
	const extra = options.extraIsothermsC ?? [];
	extra.forEach((t, i) => {
		if (typeof t !== 'number' || !Number.isFinite(t)) {
			throw new InputError(`extraIsothermsC[${i}]`, t, 'must be a finite temperature');
		}
	});
	// Fixed isotherms first, then the user's, without duplicates (the chart labels by temperature).
	const isothermsC = [...new Set([POWER_ISOTHERM_C, BRITTLE_DUCTILE_QUARTZ_C, ...extra])];
	const input = { ...model.input, depthStepM: options.depthStepM ?? SITE_CHART_DEPTH_STEP_M };
	const profile = solveGeotherm(input);
	const band = monteCarloGeotherm({
		model: input,
		heatFlowSigmaMWm2: model.heatFlowSigmaMWm2,
		layers: model.layerUncertainty,
		samples: options.samples ?? SITE_CHART_SAMPLES,
		seed: options.seed ?? SITE_CHART_SEED,
		isothermsC
	});

	const warnings = [...model.warnings, ...(profile.warnings ?? [])];
	const mohoKm = mToKm(model.mohoDepthM).toFixed(1);
	const isotherms = band.isotherms.map((iso): IsothermResult => {
		const t = iso.temperatureC;
		const deterministicM = isothermDepthM(profile, t);
		if (t <= input.surfaceTemperatureC) {
			warnings.push(`${t} °C is not above the surface temperature; it has no depth in this model.`);
		} else if (deterministicM == null) {
			warnings.push(`${t} °C is not reached above the Moho (${mohoKm} km) in the central model.`);
		} else if (iso.fractionReached < 0.9) {
			// P90 needs 90 % of samples to reach it; fewer means the deep end of the range is open.
			warnings.push(
				`${t} °C is reached above the Moho in only ${Math.round(iso.fractionReached * 100)} % of samples; its deep range is open.`
			);
		}
		return { ...iso, label: isothermLabel(t), deterministicM };
	});

	const split = heatFlowSplit(profile);
	const last = band.depthM.length - 1;
	return {
		depthM: profile.depthM,
		p10C: band.p10C,
		p50C: band.p50C,
		p90C: band.p90C,
		deterministicC: profile.temperatureC,
		layerBaseDepthsM: profile.layerBaseDepthsM ?? [],
		layerNames: model.layerNames,
		mohoDepthM: model.mohoDepthM,
		isotherms,
		mohoTemperatureC: mohoTemperatureC(profile),
		mohoTemperaturePercentilesC: {
			p10: band.p10C[last],
			p50: band.p50C[last],
			p90: band.p90C[last]
		},
		surfaceHeatFlowMWm2: profile.surfaceHeatFlowMWm2,
		mantleHeatFlowMWm2: split.heatFlowBelowMWm2,
		mantleHeatFlowPercentilesMWm2: band.basalHeatFlowMWm2,
		assumptions: model.assumptions,
		warnings,
		samples: band.samples,
		seed: band.seed
	};
}

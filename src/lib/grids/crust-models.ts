import { z } from 'zod';
import { SITE_MODEL_DEFAULTS, defaultCrustForSite } from '../chart-data/site-model';
import type { CrustLayer } from '../thermal';

/**
 * The crustal models a grid's at-depth maps can be computed in (`crust=<id>` on the at-depth
 * downloads and overlays, the grid panel's select). One module so the browser and the server
 * offer, check and describe the same models.
 *
 * Every model keeps conductivity constant with temperature: the at-depth maps rely on the
 * geotherm being affine in the surface heat flow (at-depth.ts), which holds only then. All keep
 * the same surface temperature, so the overlays' gradient classes mean the same in each.
 *
 * Numbers: the continental crust is the site model's (chart-data/site-model.ts, common practice,
 * from memory). The other three are from memory, within the usual textbook ranges for such
 * settings (thickness, granitic heat production falling with depth, shales and sands conducting
 * less than crystalline rock); no source. They are generic settings, not regional models.
 */

export const CRUST_MODEL_IDS = ['continental', 'thin', 'shield', 'basin'] as const;
export type CrustModelId = (typeof CRUST_MODEL_IDS)[number];
export const DEFAULT_CRUST_MODEL: CrustModelId = 'continental';

export const crustModelIdSchema = z.enum(CRUST_MODEL_IDS, {
	error: `crust must be one of ${CRUST_MODEL_IDS.join(', ')}`
});

export interface CrustModel {
	id: CrustModelId;
	/** Short name for the select. */
	name: string;
	/** Surface temperature (°C) and layers top to bottom, in the thermal core's input shape. */
	surfaceTemperatureC: number;
	layers: CrustLayer[];
	/** What the model assumes, in one sentence (legend, downloads, help page). */
	description: string;
	/** Where its numbers come from. */
	source: string;
}

const km = (v: number) => v * 1000;
const D = SITE_MODEL_DEFAULTS;

// The site model without a site: its layers do not depend on the heat flow given.
const continentalLayers = defaultCrustForSite({ heatFlowMWm2: 60 }).input.layers;

export const CRUST_MODELS: Record<CrustModelId, CrustModel> = {
	continental: {
		id: 'continental',
		name: 'Average continental crust (35 km)',
		surfaceTemperatureC: D.surfaceTemperatureC,
		layers: continentalLayers,
		description: `A three-layer continental crust to 35 km: upper crust 0–15 km with heat production ${D.upperCrustHeatProductionUWm3} µW/m³ at the surface decaying over ${D.heatProductionDecayKm} km and conductivity ${D.upperCrustConductivityWmK} W/m/K, middle crust 15–25 km (${D.middleCrustHeatProductionUWm3} µW/m³, ${D.middleCrustConductivityWmK} W/m/K), lower crust 25–35 km (${D.lowerCrustHeatProductionUWm3} µW/m³, ${D.lowerCrustConductivityWmK} W/m/K).`,
		source: 'Common practice, from memory (no source); the same crust as the site geotherm.'
	},
	thin: {
		id: 'thin',
		name: 'Thin, stretched crust (25 km)',
		surfaceTemperatureC: D.surfaceTemperatureC,
		layers: [
			{
				thicknessM: km(10),
				conductivityWmK: 2.5,
				heatProductionUWm3: 1.5,
				heatProductionDecayM: km(8)
			},
			{ thicknessM: km(15), conductivityWmK: 2.3, heatProductionUWm3: 0.3 }
		],
		description:
			'A two-layer crust thinned by stretching, to 25 km: upper crust 0–10 km with heat production 1.5 µW/m³ at the surface decaying over 8 km and conductivity 2.5 W/m/K, lower crust 10–25 km (0.3 µW/m³, 2.3 W/m/K).',
		source: 'From memory (no source): typical of rifted and extended continental crust.'
	},
	shield: {
		id: 'shield',
		name: 'Thick old shield crust (45 km)',
		surfaceTemperatureC: D.surfaceTemperatureC,
		layers: [
			{
				thicknessM: km(15),
				conductivityWmK: 3.0,
				heatProductionUWm3: 1.0,
				heatProductionDecayM: km(10)
			},
			{ thicknessM: km(15), conductivityWmK: 2.6, heatProductionUWm3: 0.4 },
			{ thicknessM: km(15), conductivityWmK: 2.4, heatProductionUWm3: 0.1 }
		],
		description:
			'A three-layer shield crust to 45 km with low heat production: upper crust 0–15 km with 1.0 µW/m³ at the surface decaying over 10 km and conductivity 3.0 W/m/K, middle crust 15–30 km (0.4 µW/m³, 2.6 W/m/K), lower crust 30–45 km (0.1 µW/m³, 2.4 W/m/K).',
		source: 'From memory (no source): typical of old, cold continental interiors.'
	},
	basin: {
		id: 'basin',
		name: 'Sedimentary basin: 4 km of sediment over continental crust',
		surfaceTemperatureC: D.surfaceTemperatureC,
		layers: [
			{ thicknessM: km(4), conductivityWmK: 1.8, heatProductionUWm3: 1.0 },
			{
				thicknessM: km(11),
				conductivityWmK: D.upperCrustConductivityWmK,
				heatProductionUWm3: D.upperCrustHeatProductionUWm3,
				heatProductionDecayM: km(D.heatProductionDecayKm)
			},
			...continentalLayers.slice(1)
		],
		description: `Sediment 0–4 km (conductivity 1.8 W/m/K, heat production 1.0 µW/m³) over the continental crust to 35 km: upper crust 4–15 km with ${D.upperCrustHeatProductionUWm3} µW/m³ at its top decaying over ${D.heatProductionDecayKm} km, middle and lower crust as in the average continental crust.`,
		source:
			'From memory (no source): shales and sands conduct less than crystalline rock; the crust below is the average continental crust.'
	}
};

export const CRUST_MODEL_LIST = CRUST_MODEL_IDS.map((id) => CRUST_MODELS[id]);

/** Depth (m) of the model's base: at-depth values end there. */
export function crustBaseM(model: CrustModel): number {
	return model.layers.reduce((s, l) => s + l.thicknessM, 0);
}

/** The assumptions of the at-depth maps in this model, in words. */
export function atDepthAssumptions(model: CrustModel): string {
	return `Steady one-dimensional conduction (no groundwater flow or transients), conductivity constant with temperature, surface ${model.surfaceTemperatureC} °C, in the model “${model.name}”: ${model.description} ${model.source} P10–P90 from the heat-flow σ only.`;
}

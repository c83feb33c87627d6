import { HEAT_FLOW_CLASSES } from '../map/heat-flow-scale';
import {
	BREAK_GRADIENTS_C_PER_KM,
	isothermDepthClasses,
	NOT_REACHED_COLOUR,
	SURFACE_TEMPERATURE_C,
	temperatureClasses
} from './at-depth-scale';
import {
	atDepthAssumptions,
	CRUST_MODELS,
	crustBaseM,
	DEFAULT_CRUST_MODEL,
	type CrustModelId
} from './crust-models';
import { SIGMA_CLASSES } from './sigma-scale';
import type { GridStatusView } from './status-view';

/**
 * The map overlays of a finished grid (surface heat flow, its σ, the depth of an isotherm, the
 * temperature at a depth) as the grid panel offers them: which file draws each, its legend, and
 * the limits of the chosen isotherm and depth (the server's too, so both refuse the same values).
 */

export type OverlayKind = 'value' | 'sigma' | 'isotherm-depth' | 'temperature-at-depth';
export type Percentile = 'p10' | 'p50' | 'p90';

export interface OverlayChoice {
	kind: OverlayKind;
	isothermC: number;
	depthM: number;
	percentile: Percentile;
	/** The crustal model of the at-depth overlays (crust-models.ts); default the continental crust. */
	crust?: CrustModelId;
}

const modelOf = (c: OverlayChoice) => CRUST_MODELS[c.crust ?? DEFAULT_CRUST_MODEL];

export const ISOTHERM_LIMITS_C = { min: 20, max: 1000 } as const;
export const DEPTH_LIMITS_M = { min: 100, max: 30_000 } as const;

/** Why the chosen isotherm or depth cannot be drawn, in a sentence; null when it can. */
export function overlayProblem(c: OverlayChoice): string | null {
	const ok = (v: number, l: { min: number; max: number }) =>
		Number.isFinite(v) && v >= l.min && v <= l.max;
	if (c.kind === 'isotherm-depth' && !ok(c.isothermC, ISOTHERM_LIMITS_C))
		return `Choose an isotherm from ${ISOTHERM_LIMITS_C.min} to ${ISOTHERM_LIMITS_C.max} °C.`;
	if (c.kind === 'temperature-at-depth' && !ok(c.depthM, DEPTH_LIMITS_M))
		return `Choose a depth from ${DEPTH_LIMITS_M.min / 1000} to ${DEPTH_LIMITS_M.max / 1000} km.`;
	if (c.kind === 'temperature-at-depth' && c.depthM > crustBaseM(modelOf(c)))
		return depthBelowCrust(modelOf(c).id);
	return null;
}

/** The sentence for a depth below the chosen model's base (the server says the same). */
export function depthBelowCrust(crust: CrustModelId): string {
	const m = CRUST_MODELS[crust];
	return `Choose a depth within the ${crustBaseM(m) / 1000} km of the model “${m.name}”.`;
}

/** The overlay image of a choice (null when the grid has no such file, e.g. σ of an IDW grid). */
export function overlayUrl(links: NonNullable<GridStatusView['links']>, c: OverlayChoice) {
	const withParams = (url: string, params: Record<string, string>) => {
		const [path, query = ''] = url.split('?');
		const q = new URLSearchParams(query);
		for (const [k, v] of Object.entries(params)) q.set(k, v);
		return `${path}?${q}`;
	};
	// The default crust is left out, so its addresses are those of grids before crust models.
	const crustParam = (ch: OverlayChoice): Record<string, string> =>
		modelOf(ch).id === DEFAULT_CRUST_MODEL ? {} : { crust: modelOf(ch).id };
	switch (c.kind) {
		case 'value':
			return links.png;
		case 'sigma':
			return links.sigmaPng;
		case 'isotherm-depth':
			return withParams(links.isothermDepthPng, {
				temperatureC: String(c.isothermC),
				band: c.percentile,
				...crustParam(c)
			});
		case 'temperature-at-depth':
			return withParams(links.temperatureAtDepthPng, {
				depthM: String(c.depthM),
				band: c.percentile,
				...crustParam(c)
			});
	}
}

export interface OverlayLegend {
	title: string;
	classes: { label: string; colour: string }[];
	notes: string[];
	/** What an at-depth overlay assumes (the chosen crust); empty for the surface overlays. */
	assumptions: string;
}

const PERCENTILE_WORDS: Record<Percentile, string> = {
	p10: 'P10',
	p50: 'P50 (median)',
	p90: 'P90'
};

const km = (m: number) => `${+(m / 1000).toFixed(2)} km`;

/** The legend of a choice: title with units, classes from low to high, and what it assumes. */
export function overlayLegend(c: OverlayChoice): OverlayLegend {
	const gradients = `Class breaks: average gradients of ${BREAK_GRADIENTS_C_PER_KM.join(', ')} °C/km from ${SURFACE_TEMPERATURE_C} °C at the surface.`;
	const colours = 'Colours: viridis (readable with colour-vision deficiency); brighter is hotter.';
	switch (c.kind) {
		case 'value':
			return {
				title: 'Estimated surface heat flow (mW/m²)',
				classes: HEAT_FLOW_CLASSES,
				notes: ['The same classes as the site markers.'],
				assumptions: ''
			};
		case 'sigma':
			return {
				title: 'Kriging standard error σ (mW/m²)',
				classes: SIGMA_CLASSES,
				notes: ['Darker is less certain.'],
				assumptions: ''
			};
		case 'isotherm-depth':
			return {
				title: `Depth of ${c.isothermC} °C (km), ${PERCENTILE_WORDS[c.percentile]}`,
				classes: [
					...isothermDepthClasses(c.isothermC),
					{
						label: `not reached within the ${crustBaseM(modelOf(c)) / 1000} km crust`,
						colour: NOT_REACHED_COLOUR
					}
				],
				notes: [
					'P10 is the shallowest (hot) case, P90 the deepest, from the heat-flow σ.',
					gradients,
					colours
				],
				assumptions: atDepthAssumptions(modelOf(c))
			};
		case 'temperature-at-depth':
			return {
				title: `Temperature at ${km(c.depthM)} (°C), ${PERCENTILE_WORDS[c.percentile]}`,
				classes: temperatureClasses(c.depthM),
				notes: [
					'P10 is the cool case, P90 the hot case, from the heat-flow σ.',
					gradients,
					colours
				],
				assumptions: atDepthAssumptions(modelOf(c))
			};
	}
}

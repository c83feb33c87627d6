import { SITE_MODEL_DEFAULTS } from '../chart-data/site-model';

/**
 * Colour classes of the at-depth overlays (temperature at a depth, depth of an isotherm), shared by
 * the server's overlay PNG and the panel's legend so both always agree.
 *
 * Colour scale: the seven-step "viridis" ramp (van der Walt & Smith, matplotlib 2015; the hex
 * values from memory), chosen because its lightness rises steadily from dark purple to yellow and
 * its hues run blue → green → yellow, which stay apart for the common red–green deficiencies
 * (protan, deutan) and in grey print. Checked in at-depth-scale.spec.ts: the relative luminance
 * (WCAG 2.x formula) of the classes rises strictly, so neighbouring classes differ in lightness
 * alone, whatever the hue vision. Hotter is always brighter: high temperatures and shallow
 * isotherms get the yellow end.
 *
 * Class breaks: the average geothermal gradients 20, 25, 30, 35, 40 and 50 °C/km from the model's
 * surface temperature, turned into °C at the chosen depth or km to the chosen isotherm (common
 * practice to read such maps by gradient, no source). A cell therefore gets the same class in both
 * overlays when its geotherm is straight, and the breaks follow the chosen depth or isotherm.
 */

export const VIRIDIS_7 = [
	'#440154',
	'#443983',
	'#31688e',
	'#21918c',
	'#35b779',
	'#90d743',
	'#fde725'
] as const;
/** Cells where the isotherm lies deeper than the model's crust (drawn, unlike masked cells). */
export const NOT_REACHED_COLOUR = '#bdbdbd';
/** Average gradients (°C/km) at the class breaks, coolest first. */
export const BREAK_GRADIENTS_C_PER_KM = [20, 25, 30, 35, 40, 50] as const;
export const SURFACE_TEMPERATURE_C = SITE_MODEL_DEFAULTS.surfaceTemperatureC;
export const CRUST_BASE_KM = SITE_MODEL_DEFAULTS.mohoDepthKm;

export interface OverlayClass {
	/** Lower bound (inclusive) and upper bound (exclusive), in the legend's unit. */
	min: number;
	max: number;
	colour: string;
	label: string;
}

const STEPS = [10, 5, 2, 1, 0.5, 0.2, 0.1, 0.05, 0.01];

/**
 * The breaks rounded to the coarsest step that moves none by more than a tenth of the narrowest
 * class (so classes keep their widths' order), with the decimals that step needs.
 */
function roundBreaks(raw: number[]): { breaks: number[]; decimals: number } {
	const gap = Math.min(...raw.slice(1).map((v, i) => v - raw[i]));
	for (const step of STEPS) {
		const breaks = raw.map((v) => Math.round(v / step) * step);
		if (breaks.every((b, i) => Math.abs(b - raw[i]) <= gap / 10 + 1e-9))
			return { breaks, decimals: step >= 1 ? 0 : step >= 0.1 ? 1 : 2 };
	}
	return { breaks: raw, decimals: 3 };
}

function classesOf(raw: number[], colours: readonly string[], unit: string): OverlayClass[] {
	const { breaks, decimals } = roundBreaks(raw);
	const f = (v: number) => v.toFixed(decimals);
	return colours.map((colour, i) => {
		const min = i === 0 ? -Infinity : breaks[i - 1];
		const max = i === breaks.length ? Infinity : breaks[i];
		const label =
			i === 0
				? `< ${f(max)} ${unit}`
				: max === Infinity
					? `≥ ${f(min)} ${unit}`
					: `${f(min)}–${f(max)} ${unit}`;
		return { min, max, colour, label };
	});
}

/** Classes of temperature (°C) at `depthM`, coolest first. */
export function temperatureClasses(depthM: number): OverlayClass[] {
	const km = depthM / 1000;
	const raw = BREAK_GRADIENTS_C_PER_KM.map((g) => SURFACE_TEMPERATURE_C + g * km);
	return classesOf(raw, VIRIDIS_7, '°C');
}

/** Classes of the depth (km) of `isothermC`, shallowest (hottest) first. */
export function isothermDepthClasses(isothermC: number): OverlayClass[] {
	const rise = isothermC - SURFACE_TEMPERATURE_C;
	const raw = [...BREAK_GRADIENTS_C_PER_KM].reverse().map((g) => rise / g);
	return classesOf(raw, [...VIRIDIS_7].reverse(), 'km');
}

/** The colour of `v` (in the classes' unit); NOT_REACHED_COLOUR for +Infinity. */
export function overlayColour(classes: OverlayClass[], v: number): string {
	if (v === Infinity) return NOT_REACHED_COLOUR;
	const found = classes.find((c) => v >= c.min && v < c.max);
	return (found ?? classes[classes.length - 1]).colour;
}

/**
 * Thermalith's heat-flow colour classes for maps and legends, in mW/m². The breaks bracket the
 * continental (~65) and oceanic (~101) means reported by Pollack, Hurter & Johnson (1993, from
 * memory); the ramp (cool slate → ochre → magma red) is the product's own.
 */
export interface HeatFlowClass {
	minMWm2: number;
	maxMWm2: number;
	colour: string;
	label: string;
}

const BREAKS_MWM2 = [40, 55, 70, 85, 100, 120];
const COLOURS = ['#415a77', '#5f8a9c', '#a9b98a', '#eab255', '#d2771c', '#a3241f', '#5e1214'];
export const NO_VALUE_COLOUR = '#9fafb9';

export const HEAT_FLOW_CLASSES: HeatFlowClass[] = COLOURS.map((colour, i) => {
	const minMWm2 = i === 0 ? -Infinity : BREAKS_MWM2[i - 1];
	const maxMWm2 = i === BREAKS_MWM2.length ? Infinity : BREAKS_MWM2[i];
	const label =
		i === 0 ? `< ${maxMWm2}` : maxMWm2 === Infinity ? `≥ ${minMWm2}` : `${minMWm2}–${maxMWm2}`;
	return { minMWm2, maxMWm2, colour, label };
});

/** The class colour for a heat flow in mW/m² (lower bound inclusive); grey for no value. */
export function heatFlowColour(heatFlowMWm2: number | null | undefined): string {
	if (heatFlowMWm2 === null || heatFlowMWm2 === undefined || !Number.isFinite(heatFlowMWm2)) {
		return NO_VALUE_COLOUR;
	}
	const found = HEAT_FLOW_CLASSES.find(
		(c) => heatFlowMWm2 >= c.minMWm2 && heatFlowMWm2 < c.maxMWm2
	);
	return (found ?? HEAT_FLOW_CLASSES[HEAT_FLOW_CLASSES.length - 1]).colour;
}

/**
 * How a heat-flow value was determined: the trade's own categories, stored as the
 * `heat_flow_method` enum. The one list every part of the product uses (schema, imports, quality
 * class, map filters, labels).
 */
export const HEAT_FLOW_METHODS = [
	'borehole_interval',
	'bullard',
	'bottom_hole_temperature',
	'marine_probe',
	'other'
] as const;
export type HeatFlowMethod = (typeof HEAT_FLOW_METHODS)[number];

/** Full names, for tables and panels. */
export const METHOD_LABELS: Record<HeatFlowMethod, string> = {
	borehole_interval: 'Borehole, interval method',
	bullard: 'Borehole, Bullard method',
	bottom_hole_temperature: 'Bottom-hole temperatures',
	marine_probe: 'Marine probe',
	other: 'Other'
};

/** Short names, for filter chips. */
export const METHOD_SHORT_LABELS: Record<HeatFlowMethod, string> = {
	borehole_interval: 'Interval',
	bullard: 'Bullard',
	bottom_hole_temperature: 'BHT',
	marine_probe: 'Marine probe',
	other: 'Other'
};

/** The label of a stored method, or the raw value for anything unexpected. */
export function methodLabel(method: string): string {
	return METHOD_LABELS[method as HeatFlowMethod] ?? method;
}

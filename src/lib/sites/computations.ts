/**
 * Computations a contributor runs on a site's data with the thermal core, stored with their
 * inputs and result (`site_computation`). The one list of kinds (also the
 * `site_computation_kind` enum), their labels, and the shapes of the stored JSON.
 */
export const SITE_COMPUTATION_KINDS = [
	'heat_flow',
	'horner_bht',
	'palaeoclimate',
	'heat_production'
] as const;
export type SiteComputationKind = (typeof SITE_COMPUTATION_KINDS)[number];

export const COMPUTATION_LABELS: Record<SiteComputationKind, string> = {
	heat_flow: 'Heat flow from a log',
	horner_bht: 'Formation temperature from bottom-hole temperatures (Horner)',
	palaeoclimate: 'Palaeoclimate correction of a log',
	heat_production: 'Heat production from U, Th and K'
};

export interface HornerInputs {
	depthM: number | null;
	circulationTimeH: number;
	readings: { temperatureC: number; shutInTimeH: number }[];
}
export interface HornerResult {
	formationTemperatureC: number;
	sigmaFormationTemperatureC: number | null;
	slopeC: number;
	samples: number;
	warnings: string[];
}

export interface PalaeoclimateInputs {
	logId: string;
	logName: string;
	diffusivityM2s: number;
	steps: { stepC: number; ageYears: number }[];
}
export interface PalaeoclimateResult {
	/** The corrected log stored beside the measured one. */
	correctedLogId: string;
	points: number;
	gradientBeforeKPerKm: number;
	gradientAfterKPerKm: number;
	maxPerturbationC: number;
}

export interface HeatProductionInputs {
	uraniumPpm: number;
	thoriumPpm: number;
	potassiumPct: number;
	densityKgM3: number;
}
export interface HeatProductionResult {
	heatProductionUWm3: number;
}

/** What each computation assumes, shown beside its result (docs/science.md#borehole-heat-flow). */
export const COMPUTATION_ASSUMPTIONS: Record<
	Exclude<SiteComputationKind, 'heat_flow'>,
	string[]
> = {
	horner_bht: [
		'The well was at formation temperature before drilling and cooled by circulation only (Horner 1951; Dowdle & Cobb 1975).',
		'Readings are from one depth and one logging campaign; the circulation time is the same for all of them.',
		'A straight line in the Horner time ratio: early readings and short circulation bias the estimate, usually low.'
	],
	palaeoclimate: [
		'Steps of surface temperature in a uniform half-space, conduction only (Carslaw & Jaeger 1959); steps add by superposition.',
		'One thermal diffusivity for the whole column; no groundwater flow, topography or changing cover.',
		'The chosen history is an assumption: the correction is only as good as it.'
	],
	heat_production: [
		'A = 10⁻⁵ ρ (9.52 U + 2.56 Th + 3.48 K) µW/m³, U and Th in ppm, K in weight-% (Rybach 1988).',
		'Concentrations of the sample stand for the rock around it; secular equilibrium of the decay series.'
	]
};

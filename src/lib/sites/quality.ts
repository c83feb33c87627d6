import type { HeatFlowMethod } from './methods';

/**
 * Thermalith's own quality scheme for a heat-flow determination. It ranks how well a value is
 * constrained from three things a reviewer looks at first: the relative 1-σ uncertainty, the
 * method, and how many conductivity samples stand behind it. Documented on /help/quality.
 */
export const QUALITY_CLASSES = [
	'well-constrained',
	'constrained',
	'indicative',
	'unconstrained'
] as const;
export type QualityClass = (typeof QUALITY_CLASSES)[number];

export const QUALITY_LABELS: Record<QualityClass, string> = {
	'well-constrained': 'Well constrained',
	constrained: 'Constrained',
	indicative: 'Indicative',
	unconstrained: 'Unconstrained'
};

export type QualityMethod = HeatFlowMethod;

export interface QualityInput {
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	method: QualityMethod;
	conductivitySamples: number | null;
}

/** Bottom-hole temperatures are disturbed by drilling; they can never rank above 'indicative'. */
const METHOD_CEILING: Record<QualityMethod, number> = {
	bullard: 0,
	borehole_interval: 0,
	marine_probe: 0,
	bottom_hole_temperature: 2,
	other: 2
};

/**
 * Class from relative uncertainty (≤ 10 %, ≤ 20 %, ≤ 35 %), capped by method, and lowered one step
 * when fewer than 5 conductivity samples were measured (marine probes measure in situ and are exempt).
 */
export function qualityClass(input: QualityInput): QualityClass {
	const { heatFlowMWm2: q, heatFlowSigmaMWm2: sigma } = input;
	if (q === null || sigma === null || !Number.isFinite(q) || !Number.isFinite(sigma) || q <= 0) {
		return 'unconstrained';
	}
	const relative = sigma / q;
	let rank = relative <= 0.1 ? 0 : relative <= 0.2 ? 1 : relative <= 0.35 ? 2 : 3;
	const fewSamples = (input.conductivitySamples ?? 0) < 5;
	if (fewSamples && input.method !== 'marine_probe') rank += 1;
	rank = Math.max(rank, METHOD_CEILING[input.method]);
	return QUALITY_CLASSES[Math.min(rank, 3)];
}

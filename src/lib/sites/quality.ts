import type { HeatFlowMethod } from './methods';

/**
 * Thermalith's own quality scheme for a heat-flow determination. It ranks how well a value is
 * constrained from three things a reviewer looks at first: the relative 1-σ uncertainty, the
 * method, and how many conductivity samples stand behind it. The thresholds below are the only
 * place the rules are written down: qualityClass computes from them and the help page
 * (QualityRules.svelte) renders them.
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

/** The label of a stored class; '—' when none was computed (the column is the quality_class enum). */
export function qualityLabel(value: QualityClass | null | undefined): string {
	return value == null ? '—' : QUALITY_LABELS[value];
}

export type QualityMethod = HeatFlowMethod;

/**
 * Largest relative uncertainty σ/q (inclusive) of each class above 'unconstrained'; anything
 * larger is 'unconstrained'. The scheme's own choice (no external source).
 */
export const MAX_RELATIVE_SIGMA = {
	'well-constrained': 0.1,
	constrained: 0.2,
	indicative: 0.35
} as const satisfies Partial<Record<QualityClass, number>>;

/** Fewer conductivity samples than this lowers the class one step. */
export const MIN_CONDUCTIVITY_SAMPLES = 5;

/** Methods that measure conductivity in place, so the sample rule does not apply. */
export const IN_SITU_CONDUCTIVITY_METHODS: readonly QualityMethod[] = ['marine_probe'];

/**
 * Best class each method can reach: bottom-hole temperatures are disturbed by drilling and an
 * unspecified method cannot be judged, so both stop at 'indicative'.
 */
export const BEST_CLASS_BY_METHOD: Record<QualityMethod, QualityClass> = {
	bullard: 'well-constrained',
	borehole_interval: 'well-constrained',
	marine_probe: 'well-constrained',
	bottom_hole_temperature: 'indicative',
	other: 'indicative'
};

export interface QualityInput {
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	method: QualityMethod;
	conductivitySamples: number | null;
}

const rankOf = (c: QualityClass) => QUALITY_CLASSES.indexOf(c);

/**
 * Class from the relative uncertainty (MAX_RELATIVE_SIGMA), lowered one step when fewer than
 * MIN_CONDUCTIVITY_SAMPLES conductivity samples were measured (in-situ methods are exempt), and
 * capped by the method (BEST_CLASS_BY_METHOD). A missing or non-positive value is 'unconstrained'.
 * The one place a class is computed: imports, the site page and the demo seed all call it.
 */
export function qualityClass(input: QualityInput): QualityClass {
	const { heatFlowMWm2: q, heatFlowSigmaMWm2: sigma } = input;
	if (q === null || sigma === null || !Number.isFinite(q) || !Number.isFinite(sigma) || q <= 0) {
		return 'unconstrained';
	}
	const relative = sigma / q;
	let rank = rankOf('unconstrained');
	for (const [c, max] of Object.entries(MAX_RELATIVE_SIGMA) as [QualityClass, number][]) {
		if (relative <= max) {
			rank = Math.min(rank, rankOf(c));
		}
	}
	const fewSamples = (input.conductivitySamples ?? 0) < MIN_CONDUCTIVITY_SAMPLES;
	if (fewSamples && !IN_SITU_CONDUCTIVITY_METHODS.includes(input.method)) rank += 1;
	rank = Math.max(rank, rankOf(BEST_CLASS_BY_METHOD[input.method]));
	return QUALITY_CLASSES[Math.min(rank, QUALITY_CLASSES.length - 1)];
}

// The help page's quality rules are rendered from the exported thresholds (the scheme is the
// product's own; no external source).
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import {
	BEST_CLASS_BY_METHOD,
	MAX_RELATIVE_SIGMA,
	MIN_CONDUCTIVITY_SAMPLES,
	qualityClass
} from '$lib/sites/quality';
import QualityRules from './QualityRules.svelte';

const text = (html: string) => html.replace(/<[^>]+>/g, '').replace(/\s+/g, ' ');

describe('quality rules on the help page', () => {
	it('states every threshold the classifier uses', () => {
		const { body } = render(QualityRules);
		const t = text(body);
		expect(t).toContain(
			`up to ${MAX_RELATIVE_SIGMA['well-constrained'] * 100} % is well constrained, up to ${MAX_RELATIVE_SIGMA.constrained * 100} % is constrained, up to 35 % is indicative, more is unconstrained.`
		);
		expect(t).toContain(`Fewer than ${MIN_CONDUCTIVITY_SAMPLES} conductivity samples`);
		expect(t).toContain('“Marine probe” measure conductivity in place');
		expect(t).toContain(
			'Values from “Bottom-hole temperatures” and “Other” are never ranked above indicative.'
		);
	});

	it('describes what the classifier does at the stated limits', () => {
		const at = (sigma: number, samples = MIN_CONDUCTIVITY_SAMPLES) =>
			qualityClass({
				heatFlowMWm2: 100,
				heatFlowSigmaMWm2: sigma,
				method: 'bullard',
				conductivitySamples: samples
			});
		expect(at(MAX_RELATIVE_SIGMA['well-constrained'] * 100)).toBe('well-constrained');
		expect(at(MAX_RELATIVE_SIGMA.indicative * 100 + 0.1)).toBe('unconstrained');
		expect(at(1, MIN_CONDUCTIVITY_SAMPLES - 1)).toBe('constrained');
		expect(BEST_CLASS_BY_METHOD.bottom_hole_temperature).toBe('indicative');
	});
});

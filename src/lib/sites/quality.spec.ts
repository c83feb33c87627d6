import { describe, expect, it } from 'vitest';
import { qualityClass, qualityLabel, type QualityInput } from './quality';

// The scheme is Thermalith's own (no external source); these cases pin its documented rules.
const base: QualityInput = {
	heatFlowMWm2: 70,
	heatFlowSigmaMWm2: 5,
	method: 'bullard',
	conductivitySamples: 12
};

describe('qualityClass', () => {
	it.each([
		[{ heatFlowSigmaMWm2: 7 }, 'well-constrained'], // 10 % exactly is still the top class
		[{ heatFlowSigmaMWm2: 7.1 }, 'constrained'],
		[{ heatFlowSigmaMWm2: 14 }, 'constrained'],
		[{ heatFlowSigmaMWm2: 20 }, 'indicative'],
		[{ heatFlowSigmaMWm2: 30 }, 'unconstrained'],
		[{ conductivitySamples: 3 }, 'constrained'],
		[{ method: 'marine_probe', conductivitySamples: 0 }, 'well-constrained'],
		[{ method: 'bottom_hole_temperature' }, 'indicative'],
		[{ heatFlowSigmaMWm2: null }, 'unconstrained'],
		[{ heatFlowMWm2: -5 }, 'unconstrained'],
		[{ heatFlowMWm2: Number.NaN }, 'unconstrained']
	] as const)('%o → %s', (change, expected) => {
		expect(qualityClass({ ...base, ...change } as QualityInput)).toBe(expected);
	});
});

describe('qualityLabel', () => {
	it('labels stored classes and shows a dash when none was computed', () => {
		expect(qualityLabel('well-constrained')).toBe('Well constrained');
		expect(qualityLabel(null)).toBe('—');
	});
});

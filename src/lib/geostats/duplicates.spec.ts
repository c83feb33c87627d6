import { describe, expect, it } from 'vitest';
import { mergeDuplicateSamples } from './duplicates';

describe('mergeDuplicateSamples (inverse-variance weighted mean, Taylor 1997 ch. 7)', () => {
	it('inverse-variance weights co-located samples that all have sigma', () => {
		const out = mergeDuplicateSamples([
			{ x: 1, y: 2, value: 10, sigma: 1 },
			{ x: 5, y: 5, value: 3 },
			{ x: 1, y: 2, value: 20, sigma: 2 }
		]);
		expect(out).toHaveLength(2);
		// weights 1 and 1/4 → (10 + 5) / 1.25 = 12; σ = 1/√1.25
		expect(out[0].value).toBeCloseTo(12, 12);
		expect(out[0].sigma).toBeCloseTo(1 / Math.sqrt(1.25), 12);
		expect(out[1]).toEqual({ x: 5, y: 5, value: 3 });
	});

	it('keeps only the exact members (no sigma) when there are any', () => {
		const out = mergeDuplicateSamples([
			{ x: 0, y: 0, value: 10 },
			{ x: 0, y: 0, value: 14 },
			{ x: 0, y: 0, value: 100, sigma: 5 }
		]);
		expect(out).toEqual([{ x: 0, y: 0, value: 12 }]);
	});
});

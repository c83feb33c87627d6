// Test helpers for the pure modules' specs: float comparison with an explicit tolerance and the
// InputError a call throws.
import { expect } from 'vitest';

/** Asserts |actual − expected| <= abs + rel·|expected|; NaN never passes. */
export function expectClose(
	actual: number,
	expected: number,
	tolerance: { abs?: number; rel?: number },
	label = ''
): void {
	const allowed = (tolerance.abs ?? 0) + (tolerance.rel ?? 0) * Math.abs(expected);
	const error = Math.abs(actual - expected);
	expect(Number.isNaN(actual), `${label}: NaN`).toBe(false);
	expect(error, `${label}: ${actual} vs ${expected} (allowed ${allowed})`).toBeLessThanOrEqual(
		allowed
	);
}

/** Runs fn and returns the InputError-like error it throws (fails if nothing is thrown). */
export function thrown(fn: () => unknown): RangeError & { field?: string } {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(RangeError);
		return e as RangeError & { field?: string };
	}
	expect.fail('expected a RangeError');
}

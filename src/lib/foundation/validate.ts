// Input checks shared by every pure module. Validation happens once, at the public entry points;
// inner closed forms trust their inputs. Each helper returns the checked value so callers can
// validate and read in one step.

import { InputError } from './errors';

/** Throws unless `value` is a finite number; returns it. */
export function requireFinite(field: string, value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new InputError(field, value, 'must be a finite number');
	}
	return value;
}

/** Throws unless `value` is finite and > 0; returns it. */
export function requirePositive(field: string, value: unknown): number {
	const v = requireFinite(field, value);
	if (!(v > 0)) throw new InputError(field, value, 'must be > 0');
	return v;
}

/** Throws unless `value` is finite and >= 0; returns it. */
export function requireNonNegative(field: string, value: unknown): number {
	const v = requireFinite(field, value);
	if (!(v >= 0)) throw new InputError(field, value, 'must be >= 0');
	return v;
}

/** Throws unless `value` is an integer >= 1; returns it. */
export function requirePositiveInteger(field: string, value: unknown): number {
	const v = requirePositive(field, value);
	if (!Number.isInteger(v)) throw new InputError(field, value, 'must be an integer');
	return v;
}

/** Throws unless `value` is finite and within [min, max]; returns it. */
export function requireInRange(field: string, value: unknown, min: number, max: number): number {
	const v = requireFinite(field, value);
	if (!(v >= min && v <= max)) {
		throw new InputError(field, value, `must be between ${min} and ${max}`);
	}
	return v;
}

/** Throws unless every element is finite and the array is strictly increasing. */
export function requireIncreasing(field: string, values: ArrayLike<number>): void {
	for (let i = 0; i < values.length; i++) {
		requireFinite(`${field}[${i}]`, values[i]);
		if (i > 0 && !(values[i] > values[i - 1])) {
			throw new InputError(
				`${field}[${i}]`,
				values[i],
				`must be greater than ${field}[${i - 1}] = ${values[i - 1]} (strictly increasing)`
			);
		}
	}
}

/** Throws unless every element is finite. */
export function requireAllFinite(field: string, values: ArrayLike<number>): void {
	for (let i = 0; i < values.length; i++) requireFinite(`${field}[${i}]`, values[i]);
}

/** Throws unless the two arrays have the same length. */
export function requireSameLength(
	field: string,
	a: ArrayLike<unknown>,
	b: ArrayLike<unknown>
): void {
	if (a.length !== b.length) {
		throw new InputError(field, b.length, `must have the same length as its pair (${a.length})`);
	}
}

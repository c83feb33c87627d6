import { ThermalInputError } from './errors';

// Validation happens once, at the public entry points; inner closed forms trust their inputs.

/** Throws unless `value` is a finite number. */
export function requireFinite(field: string, value: number): void {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ThermalInputError(field, value, 'must be a finite number');
	}
}

/** Throws unless `value` is finite and > 0. */
export function requirePositive(field: string, value: number): void {
	requireFinite(field, value);
	if (!(value > 0)) throw new ThermalInputError(field, value, 'must be > 0');
}

/** Throws unless `value` is finite and >= 0. */
export function requireNonNegative(field: string, value: number): void {
	requireFinite(field, value);
	if (!(value >= 0)) throw new ThermalInputError(field, value, 'must be >= 0');
}

/** Throws unless `value` is finite and within [min, max]. */
export function requireInRange(field: string, value: number, min: number, max: number): void {
	requireFinite(field, value);
	if (!(value >= min && value <= max)) {
		throw new ThermalInputError(field, value, `must be between ${min} and ${max}`);
	}
}

/** Throws unless every element is finite and the array is strictly increasing. */
export function requireIncreasing(field: string, values: ArrayLike<number>): void {
	for (let i = 0; i < values.length; i++) {
		requireFinite(`${field}[${i}]`, values[i]);
		if (i > 0 && !(values[i] > values[i - 1])) {
			throw new ThermalInputError(
				`${field}[${i}]`,
				values[i],
				`must be greater than ${field}[${i - 1}] = ${values[i - 1]} (depths strictly increasing)`
			);
		}
	}
}

/** Throws unless every element is finite. */
export function requireAllFinite(field: string, values: ArrayLike<number>): void {
	for (let i = 0; i < values.length; i++) requireFinite(`${field}[${i}]`, values[i]);
}

/** Throws unless the two arrays have the same length. */
export function requireSameLength(field: string, a: ArrayLike<number>, b: ArrayLike<number>): void {
	if (a.length !== b.length) {
		throw new ThermalInputError(
			field,
			b.length,
			`must have the same length as its pair (${a.length})`
		);
	}
}

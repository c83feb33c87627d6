import { describe, expect, it } from 'vitest';
import { InputError } from './errors';
import {
	requireAllFinite,
	requireFinite,
	requireIncreasing,
	requireInRange,
	requireNonNegative,
	requirePositive,
	requirePositiveInteger,
	requireSameLength
} from './validate';

function caught(fn: () => unknown): InputError {
	try {
		fn();
	} catch (e) {
		expect(e).toBeInstanceOf(InputError);
		return e as InputError;
	}
	return expect.fail('expected an InputError');
}

describe('shared input checks', () => {
	it('return the checked value', () => {
		expect(requireFinite('x', -2)).toBe(-2);
		expect(requirePositive('x', 3)).toBe(3);
		expect(requireNonNegative('x', 0)).toBe(0);
		expect(requirePositiveInteger('n', 4)).toBe(4);
		expect(requireInRange('p', 0.5, 0, 1)).toBe(0.5);
	});

	it('name the field and the value in one message style', () => {
		const e = caught(() => requirePositive('layers[2].thicknessM', -250));
		expect(e.field).toBe('layers[2].thicknessM');
		expect(e.value).toBe(-250);
		expect(e.message).toBe('layers[2].thicknessM must be > 0; got -250');
		expect(e.requirement).toBe('must be > 0');
		expect(caught(() => requireFinite('q', NaN)).message).toBe(
			'q must be a finite number; got NaN'
		);
		expect(caught(() => requireFinite('q', '60')).message).toBe(
			'q must be a finite number; got "60"'
		);
		expect(caught(() => requireNonNegative('s', -1)).message).toBe('s must be >= 0; got -1');
		expect(caught(() => requirePositiveInteger('n', 2.5)).message).toBe(
			'n must be an integer; got 2.5'
		);
		expect(caught(() => requireInRange('p', 2, 0, 1)).message).toBe(
			'p must be between 0 and 1; got 2'
		);
	});

	it('check arrays element by element', () => {
		expect(caught(() => requireIncreasing('depthM', [0, 10, 10])).field).toBe('depthM[2]');
		expect(caught(() => requireAllFinite('t', [1, Infinity])).field).toBe('t[1]');
		expect(caught(() => requireSameLength('t', [1, 2], [1])).value).toBe(1);
		expect(() => requireIncreasing('depthM', [0, 1, 2])).not.toThrow();
	});

	it('summarise large arrays instead of printing them', () => {
		const e = new InputError('samples', new Array(5000).fill(0), 'needs more');
		expect(e.message).toBe('samples needs more; got an array of length 5000');
		expect(e).toBeInstanceOf(RangeError);
	});
});

import { describe, expect, it } from 'vitest';
import { readTypedNumber, requirementInWords } from './typed-number';

describe('readTypedNumber', () => {
	it.each([
		['35', 35],
		[' 2.5 ', 2.5],
		['2,5', 2.5],
		[',5', 0.5],
		['-5', -5],
		['\u22125', -5],
		['1e3', 1000],
		['3.', 3],
		['1,25', 1.25],
		['1,2500', 1.25]
	])('reads %j as %d', (text, value) => {
		expect(readTypedNumber(text)).toEqual({ ok: true, value });
	});

	it('reads blank as not given', () => {
		expect(readTypedNumber('  ')).toEqual({ ok: true, value: null });
	});

	it.each(['abc', '2,5,1', '1.2.3', '--3', '2 5', '12°C'])('refuses %j in words', (text) => {
		const r = readTypedNumber(text);
		expect(r.ok).toBe(false);
		if (!r.ok) expect(r.message).toBe('Enter a number, such as 2.5 or 2,5.');
	});

	it('refuses a comma that could be a thousands separator, naming both readings', () => {
		const r = readTypedNumber('1,250');
		expect(r).toEqual({
			ok: false,
			message: '“1,250” could mean 1.250 or 1250: write it with a point, or without the comma.'
		});
	});

	it('refuses numbers too large to be finite', () => {
		expect(readTypedNumber('1e999')).toEqual({
			ok: false,
			message: 'Enter a number of ordinary size.'
		});
	});
});

describe('requirementInWords', () => {
	it('rewrites comparison signs and names the entered value', () => {
		expect(requirementInWords('must be > 0', -5)).toBe(
			'must be greater than 0 (you entered \u22125)'
		);
		expect(requirementInWords('must be >= 0; got -1', -1)).toBe(
			'must be at least 0 (you entered \u22121)'
		);
		expect(requirementInWords('must be a finite number', NaN)).toBe('must be a finite number');
	});
});

import { describe, expect, it } from 'vitest';
import { safeNext } from './safe-next';

// Open-redirect protection: common practice (OWASP Unvalidated Redirects and Forwards cheat sheet;
// WHATWG URL Standard for stripped tab/newline and backslash-as-slash), from memory.
describe('safeNext', () => {
	it.each([
		['/map?bbox=1,2,3,4', '/map?bbox=1,2,3,4'],
		['/datasets/abc?q=a%20b#sites', '/datasets/abc?q=a%20b#sites'],
		['/', '/']
	])('follows %j', (input, expected) => {
		expect(safeNext(input)).toBe(expected);
	});

	it.each([
		'https://evil.example/',
		'//evil.example/',
		'/\\evil.example',
		'\\\\evil.example',
		'/\t/evil.example/phish',
		'/\n/evil.example',
		'/\r/x',
		'/%09/evil.example/phish',
		'/%2F/evil.example',
		'/%5Cevil.example',
		'/%0d/x',
		'/%E0%A4%A',
		' /account',
		'javascript:alert(1)',
		'account',
		'',
		null,
		undefined
	])('refuses %j', (input) => {
		expect(safeNext(input)).toBe('/account');
	});

	it('uses the given fallback', () => {
		expect(safeNext('//evil.example', '')).toBe('');
	});
});

import { describe, expect, it } from 'vitest';
import { safeNext } from './safe-next';

// Open-redirect protection: common practice (OWASP Unvalidated Redirects cheat sheet, from memory).
describe('safeNext', () => {
	it.each([
		['/map?bbox=1,2,3,4', '/map?bbox=1,2,3,4'],
		['https://evil.example/', '/account'],
		['//evil.example/', '/account'],
		['/\\evil.example', '/account'],
		['', '/account'],
		[null, '/account']
	])('%s → %s', (input, expected) => {
		expect(safeNext(input)).toBe(expected);
	});
});

import { describe, expect, it } from 'vitest';
import { takesKeys } from './key-auth';
import { hashKey, keyFromHeaders, newKeySecret, SHOWN_CHARACTERS } from './key-secret';

describe('API key secrets', () => {
	it('makes keys of 32 random bytes, shows a prefix and keeps a SHA-256 hash', () => {
		const a = newKeySecret();
		const b = newKeySecret();
		expect(a.key).toMatch(/^thl_[A-Za-z0-9_-]{43}$/);
		expect(a.key).not.toBe(b.key);
		expect(a.prefix).toBe(a.key.slice(0, SHOWN_CHARACTERS));
		expect(a.hash).toBe(hashKey(a.key));
		expect(a.hash).toMatch(/^[0-9a-f]{64}$/);
		expect(a.hash).not.toContain(a.key.slice(4));
	});

	it('reads the key from X-API-Key or Authorization: Bearer', () => {
		expect(keyFromHeaders(new Headers({ 'x-api-key': ' thl_a ' }))).toBe('thl_a');
		expect(keyFromHeaders(new Headers({ authorization: 'Bearer thl_b' }))).toBe('thl_b');
		expect(keyFromHeaders(new Headers({ authorization: 'bearer  thl_c' }))).toBe('thl_c');
		expect(keyFromHeaders(new Headers())).toBeNull();
		// Another scheme is still a key attempt, so it is refused rather than ignored.
		expect(keyFromHeaders(new Headers({ authorization: 'Basic eDp5' }))).toBe('Basic eDp5');
	});

	it('is honoured on /api/v1 and /ogc only', () => {
		for (const p of ['/api/v1/sites', '/api/v1', '/ogc', '/ogc/collections'])
			expect(takesKeys(p)).toBe(true);
		for (const p of ['/account', '/api/auth/sign-in/email', '/api/v1x', '/ogcx', '/api/health'])
			expect(takesKeys(p)).toBe(false);
	});
});

import { getCookies } from 'better-auth/cookies';
import { describe, expect, it } from 'vitest';
import { cookieSettings } from './cookies';

// What better-auth derives from our settings (its own getCookies), not what we hope it does.
describe('session cookie attributes', () => {
	it('are Secure, HttpOnly and SameSite=Lax when the origin is https', () => {
		const baseURL = 'https://thermalith.example';
		const { sessionToken } = getCookies({ baseURL, advanced: cookieSettings(baseURL) });
		expect(sessionToken.attributes).toMatchObject({
			secure: true,
			httpOnly: true,
			sameSite: 'lax'
		});
		expect(sessionToken.name.startsWith('__Secure-')).toBe(true);
	});

	it('are HttpOnly and SameSite=Lax, not Secure, on a plain-http development origin', () => {
		const baseURL = 'http://127.0.0.1:3000';
		const { sessionToken } = getCookies({ baseURL, advanced: cookieSettings(baseURL) });
		expect(sessionToken.attributes).toMatchObject({
			secure: false,
			httpOnly: true,
			sameSite: 'lax'
		});
	});
});

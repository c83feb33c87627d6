import { describe, expect, it } from 'vitest';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

// Headers every answer carries: OWASP HTTP Headers cheat sheet and MDN (CSP, Permissions-Policy),
// from memory. The test build runs on http, so HSTS must be absent here (its https case is a unit test).
function expectCommonHeaders(res: Response, what: string) {
	expect(res.headers.get('x-content-type-options'), what).toBe('nosniff');
	expect(res.headers.get('x-frame-options'), what).toBe('DENY');
	expect(res.headers.get('referrer-policy'), what).toBe('strict-origin-when-cross-origin');
	expect(res.headers.get('permissions-policy'), what).toMatch(/camera=\(\)/);
	expect(res.headers.get('content-security-policy'), what).toMatch(/frame-ancestors 'none'/);
	expect(res.headers.get('strict-transport-security'), what).toBeNull();
}

describe('security headers', () => {
	it('give pages a nonce-based CSP that changes per response and never names the object store', async () => {
		const first = await new Client().get('/');
		expectCommonHeaders(first, '/');
		const csp = first.headers.get('content-security-policy')!;
		const nonce = csp.match(/script-src 'self' 'nonce-([^']+)'/)?.[1];
		expect(nonce).toBeTruthy();
		expect(csp).toMatch(/default-src 'self'/);
		expect(csp).toMatch(/object-src 'none'/);
		expect(csp).not.toMatch(/script-src[^;]*unsafe-(inline|eval)/);
		// Files go through the app: the browser has no business with the store's address.
		expect(csp).not.toContain(new URL(testEnv.s3().endpoint).host);
		expect(await first.text()).toContain(`nonce="${nonce}"`);
		const second = await new Client().get('/');
		expect(second.headers.get('content-security-policy')).not.toContain(nonce);
	});

	it('are on API answers, error pages, better-auth answers and download redirects too', async () => {
		const client = new Client();
		for (const path of [
			'/api/v1/sites.geojson?bbox=3,56,12,61',
			'/api/health',
			'/api/auth/get-session',
			`/api/v1/attachments/${crypto.randomUUID()}/download`,
			'/no-such-page'
		]) {
			const res = await client.get(path);
			expectCommonHeaders(res, path);
		}
		const api = await client.get('/api/v1/sites.geojson?bbox=3,56,12,61');
		expect(api.headers.get('content-security-policy')).toMatch(/^default-src 'none'/);
	});

	it('keep anything a signed-in person sees out of caches', async () => {
		const client = await signIn('curator@korvald-survey.example', DEMO_PASSWORD);
		for (const path of ['/account', '/map', '/api/v1/sites.geojson?bbox=3,56,12,61', '/']) {
			const res = await client.get(path);
			expect(res.headers.get('cache-control'), path).toBe('private, no-store');
		}
	});

	it('set the session cookie HttpOnly and SameSite=Lax, and the sign-in answer uncached', async () => {
		const client = new Client();
		const res = await client.post('/sign-in', {
			email: 'viewer@korvald-survey.example',
			password: DEMO_PASSWORD
		});
		expect(res.status).toBe(303);
		const session = res.headers.getSetCookie().find((c) => c.includes('session_token='));
		expect(session).toMatch(/;\s*HttpOnly/i);
		expect(session).toMatch(/;\s*SameSite=Lax/i);
		expect(res.headers.get('cache-control')).toBe('private, no-store');
	});
});

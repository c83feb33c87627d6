import { describe, expect, it } from 'vitest';
import { Client, DEMO_PASSWORD, signIn } from './http';

// `next=` after sign-in may only lead to a path on this site (finding: a tab let it leave).
const EVIL = ['/%09/evil.example/phish', '/%5Cevil.example', '//evil.example', '/%0d/x'];

describe('sign-in next= parameter', () => {
	it('sends a signed-in visitor to /account instead of another origin, never answering 500', async () => {
		const client = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
		for (const next of EVIL) {
			const res = await client.get(`/sign-in?next=${next}`);
			expect(res.status, next).toBe(303);
			expect(res.headers.get('location'), next).toBe('/account');
		}
		const ok = await client.get(`/sign-in?next=${encodeURIComponent('/map?method=bullard')}`);
		expect(ok.headers.get('location')).toBe('/map?method=bullard');
	});

	it('does not put an unsafe next into the sign-in form, and the page still loads', async () => {
		for (const next of EVIL) {
			const res = await new Client().get(`/sign-in?next=${next}`);
			expect(res.status, next).toBe(200);
			expect(await res.text()).toMatch(/name="next" value=""/);
		}
	});

	it('redirects to /account after signing in with a tab-smuggled next', async () => {
		const client = new Client();
		const res = await client.post('/sign-in', {
			email: 'viewer@korvald-survey.example',
			password: DEMO_PASSWORD,
			next: '/\t/evil.example/phish'
		});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/account');
	});
});

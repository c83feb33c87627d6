import { describe, expect, it } from 'vitest';
import { API_CSP, addCspSources, cspSource, withSecurityHeaders } from './security-headers';

const ctx = { https: false, extraSources: { 'connect-src': [], 'img-src': [] }, private: false };

describe('withSecurityHeaders', () => {
	it('sends HSTS and upgrade-insecure-requests only when the site is on https', () => {
		const page = () =>
			new Response('x', { headers: { 'content-security-policy': "default-src 'self'" } });
		const plain = withSecurityHeaders(page(), ctx);
		expect(plain.headers.get('strict-transport-security')).toBeNull();
		expect(plain.headers.get('content-security-policy')).toBe("default-src 'self'");
		const secure = withSecurityHeaders(page(), { ...ctx, https: true });
		expect(secure.headers.get('strict-transport-security')).toMatch(/max-age=\d{8}/);
		expect(secure.headers.get('content-security-policy')).toMatch(/upgrade-insecure-requests$/);
	});

	it('gives responses without a page CSP one that allows nothing, even immutable redirects', () => {
		const res = withSecurityHeaders(Response.redirect('https://store.example/file', 302), ctx);
		expect(res.status).toBe(302);
		expect(res.headers.get('location')).toBe('https://store.example/file');
		expect(res.headers.get('content-security-policy')).toBe(API_CSP);
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
	});

	it('marks private answers and answers that set cookies private, no-store', () => {
		const mine = withSecurityHeaders(
			new Response('{}', { headers: { 'cache-control': 'public, max-age=60' } }),
			{ ...ctx, private: true }
		);
		expect(mine.headers.get('cache-control')).toBe('private, no-store');
		const cookie = withSecurityHeaders(new Response('', { headers: { 'set-cookie': 'a=b' } }), ctx);
		expect(cookie.headers.get('cache-control')).toBe('private, no-store');
		const open = withSecurityHeaders(
			new Response('{}', { headers: { 'cache-control': 'public, max-age=60' } }),
			ctx
		);
		expect(open.headers.get('cache-control')).toBe('public, max-age=60');
	});
});

describe('addCspSources', () => {
	it('appends to the named directives only', () => {
		expect(
			addCspSources("default-src 'self'; connect-src 'self'; img-src 'self' data:", {
				'connect-src': ['http://127.0.0.1:9000'],
				'img-src': ['http://127.0.0.1:9000']
			})
		).toBe(
			"default-src 'self'; connect-src 'self' http://127.0.0.1:9000; img-src 'self' data: http://127.0.0.1:9000"
		);
	});
});

describe('cspSource', () => {
	it.each([
		['http://127.0.0.1:54341', 'http://127.0.0.1:54341'],
		['https://{s}.tiles.example/{z}/{x}/{y}.png', 'https://*.tiles.example'],
		['https://tiles.example:8443/{z}/{x}/{y}.png?key=abc', 'https://tiles.example:8443'],
		['https://a{s}.tiles.example/{z}/{x}/{y}.png', 'https:'],
		['javascript:alert(1)', null],
		[undefined, null]
	])('%s → %s', (input, expected) => {
		expect(cspSource(input)).toBe(expected);
	});
});

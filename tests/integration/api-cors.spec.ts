import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { KeyClient, keyFor } from './api-key-client';
import { testEnv } from './env';
import { DEMO_PASSWORD, signIn, type Client } from './http';

/*
 * CORS of /api/v1: a script on a page of another origin may send its key header and a JSON body
 * (the browser asks first with a preflight), and read the answers, errors included; never with
 * credentials, so such a page can neither use nor read a visitor's session.
 */

const ELSEWHERE = 'https://scripts.elsewhere.example';
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let script: KeyClient;
let member: Client;

beforeAll(async () => {
	script = new KeyClient((await keyFor(db, 'viewer@korvald-survey.example')).key, 'x-api-key');
	member = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
});
afterAll(async () => {
	await sql.end();
});

const preflight = (path: string, method: string, headers: string, cookie?: string) =>
	fetch(`${testEnv.appUrl()}${path}`, {
		method: 'OPTIONS',
		headers: {
			origin: ELSEWHERE,
			'access-control-request-method': method,
			'access-control-request-headers': headers,
			...(cookie ? { cookie } : {})
		}
	});

const list = (value: string | null) => (value ?? '').split(',').map((v) => v.trim().toLowerCase());

describe('CORS preflight on /api/v1', () => {
	it('allows a key header and a JSON body from any origin, without credentials', async () => {
		for (const [path, method, headers] of [
			['/api/v1/sites', 'GET', 'authorization'],
			['/api/v1/sites', 'GET', 'x-api-key, if-none-match'],
			['/api/v1/compute/geotherm', 'POST', 'x-api-key, content-type'],
			[`/api/v1/attachments/${crypto.randomUUID()}`, 'DELETE', 'authorization']
		]) {
			const res = await preflight(path, method, headers);
			expect(res.status, path).toBe(204);
			expect(res.headers.get('access-control-allow-origin')).toBe('*');
			expect(res.headers.get('access-control-allow-credentials')).toBeNull();
			expect(list(res.headers.get('access-control-allow-methods'))).toContain(method.toLowerCase());
			const allowed = list(res.headers.get('access-control-allow-headers'));
			for (const h of list(headers)) expect(allowed, `${path} ${h}`).toContain(h);
			expect(await res.text()).toBe('');
		}
	});

	it('does not open a session for a preflight that carries cookies', async () => {
		// The member's real session cookie (the client keeps it; tests may read it).
		const cookie = (member as unknown as { cookieHeader(): string }).cookieHeader();
		expect(cookie).toContain('session_token');
		const res = await preflight('/api/v1/datasets', 'GET', 'authorization', cookie);
		expect(res.status).toBe(204);
		expect(res.headers.get('access-control-allow-credentials')).toBeNull();
		expect(res.headers.getSetCookie()).toEqual([]);
	});
});

describe('answers a script on another origin may read', () => {
	it('successes and refusals carry Allow-Origin * and never Allow-Credentials', async () => {
		const ok = await script.fetch('/api/v1/sites?limit=1', { headers: { origin: ELSEWHERE } });
		expect(ok.status).toBe(200);
		expect(ok.headers.get('access-control-allow-origin')).toBe('*');
		expect(list(ok.headers.get('access-control-expose-headers'))).toContain('etag');
		const bad = await new KeyClient('thl_unknown').fetch('/api/v1/sites', {
			headers: { origin: ELSEWHERE }
		});
		expect(bad.status).toBe(401);
		expect(bad.headers.get('access-control-allow-origin')).toBe('*');
		expect((await bad.json()).error.code).toBe('invalid_api_key');
		for (const res of [ok, bad])
			expect(res.headers.get('access-control-allow-credentials')).toBeNull();
	});

	it('a cookie-carrying change from another origin is still refused (the Origin check)', async () => {
		const res = await member.json('/api/v1/compute/geotherm', {}, 'POST', { origin: ELSEWHERE });
		expect(res.status).toBe(403);
		expect((await res.json()).error.code).toBe('cross_site_refused');
	});
});

import { describe, expect, it } from 'vitest';
import { apiPreflight, isApiPath, withApiCors } from './cors';

describe('/api/v1 CORS', () => {
	it('answers a preflight for the key headers and a JSON body, never with credentials', () => {
		const res = apiPreflight();
		expect(res.status).toBe(204);
		expect(res.headers.get('access-control-allow-origin')).toBe('*');
		expect(res.headers.get('access-control-allow-credentials')).toBeNull();
		const headers = res.headers.get('access-control-allow-headers')!.toLowerCase();
		for (const h of ['authorization', 'x-api-key', 'content-type', 'if-none-match'])
			expect(headers).toContain(h);
	});

	it('marks answers readable from any origin, also answers with immutable headers', async () => {
		const fetched = Response.redirect('https://thermalith.example/x', 302);
		const out = withApiCors(fetched);
		expect(out.headers.get('access-control-allow-origin')).toBe('*');
		expect(withApiCors(new Response('{}')).headers.get('access-control-expose-headers')).toContain(
			'ETag'
		);
	});

	it('covers /api/v1 only', () => {
		expect(isApiPath('/api/v1')).toBe(true);
		expect(isApiPath('/api/v1/sites')).toBe(true);
		expect(isApiPath('/api/v10')).toBe(false);
		expect(isApiPath('/api/auth/sign-in')).toBe(false);
	});
});

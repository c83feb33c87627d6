import { describe, expect, it } from 'vitest';
import { crossOriginRefusal } from './origin-check';

const APP = 'https://thermalith.example';
const req = (method: string, headers: Record<string, string>) =>
	new Request(`${APP}/api/v1/x`, { method, headers });

describe('crossOriginRefusal', () => {
	it('refuses state-changing requests with cookies from another origin', async () => {
		for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
			const res = crossOriginRefusal(
				req(method, { cookie: 'a=b', origin: 'https://evil.example' }),
				APP
			);
			expect(res?.status, method).toBe(403);
			expect((await res!.json()).error.message).toMatch(/Cross-site/);
		}
		// Outside the machine interfaces (account routes) the older { message } body stays.
		const other = new Request(`${APP}/api/auth/x`, {
			method: 'POST',
			headers: { cookie: 'a=b', origin: 'https://evil.example' }
		});
		expect((await crossOriginRefusal(other, APP)!.json()).message).toMatch(/Cross-site/);
		expect(crossOriginRefusal(req('POST', { cookie: 'a=b', origin: 'null' }), APP)?.status).toBe(
			403
		);
	});

	it('lets through same-origin, cookie-less, Origin-less and read-only requests', () => {
		expect(crossOriginRefusal(req('POST', { cookie: 'a=b', origin: APP }), APP)).toBeNull();
		expect(crossOriginRefusal(req('POST', { origin: 'https://evil.example' }), APP)).toBeNull();
		expect(crossOriginRefusal(req('DELETE', { cookie: 'a=b' }), APP)).toBeNull();
		expect(
			crossOriginRefusal(req('GET', { cookie: 'a=b', origin: 'https://evil.example' }), APP)
		).toBeNull();
	});
});

import type { RequestEvent } from '@sveltejs/kit';
import { describe, expect, it, vi } from 'vitest';
import { landingPage } from './documents';
import { ogcGet } from './handler';

const event = (path: string, headers: Record<string, string> = {}) => {
	const url = new URL(`http://x${path}`);
	return { url, request: new Request(url, { headers }) } as unknown as RequestEvent;
};

describe('ogcGet: one handler shape for every /ogc resource', () => {
	const landing = ogcGet(async () => landingPage('http://x/ogc'));

	it('answers JSON to scripts and GIS clients, HTML to browsers, with CORS and an ETag', async () => {
		const json = await landing(event('/ogc', { accept: 'application/json' }));
		expect(json.headers.get('content-type')).toBe('application/json');
		expect(json.headers.get('access-control-allow-origin')).toBe('*');
		expect(json.headers.get('etag')).toMatch(/^W\//);
		const html = await landing(event('/ogc', { accept: 'text/html' }));
		expect(html.headers.get('content-type')).toBe('text/html; charset=utf-8');
		const page = await html.text();
		expect(page).toContain('<title>Thermalith heat-flow sites (OGC API – Features) · Thermalith');
		expect(page).toContain('href="http://x/ogc/conformance"');
	});

	it('refuses an unknown query parameter before doing any work', async () => {
		const build = vi.fn(async () => landingPage('http://x/ogc'));
		const res = await ogcGet(build)(event('/ogc?bbox=1,2,3,4'));
		expect(res.status).toBe(400);
		expect((await res.json()).error).toMatchObject({
			code: 'unknown_parameter',
			details: { parameter: 'bbox' }
		});
		expect(build).not.toHaveBeenCalled();
	});

	it('escapes text from the data in HTML', async () => {
		const doc = landingPage('http://x/ogc');
		doc.html.title = '<script>alert(1)</script>';
		const res = await ogcGet(async () => doc)(event('/ogc?f=html'));
		const page = await res.text();
		expect(page).not.toContain('<script>alert(1)</script>');
		expect(page).toContain('&lt;script>alert(1)&lt;/script>');
	});

	it('keeps the one error body, with an id from the log, when something fails', async () => {
		const quiet = vi.spyOn(console, 'error').mockImplementation(() => {});
		const res = await ogcGet(async () => {
			throw new Error('database down');
		})(event('/ogc'));
		expect(res.status).toBe(500);
		expect(res.headers.get('access-control-allow-origin')).toBe('*');
		const body = await res.json();
		expect(body.error.code).toBe('internal_error');
		expect(body.error.message).not.toContain('database');
		expect(body.error.details.errorId).toMatch(/^[0-9a-f-]{36}$/);
		expect(quiet).toHaveBeenCalled();
		quiet.mockRestore();
	});
});

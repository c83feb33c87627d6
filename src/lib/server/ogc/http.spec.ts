import { describe, expect, it } from 'vitest';
import { chooseFormat, contentResponse, etagOf, notModified, preflight } from './http';

const url = (q = '') => new URL(`http://x/ogc${q}`);

describe('format: f parameter, then the Accept header', () => {
	it('f decides; anything else than json or html is refused', () => {
		expect(chooseFormat(url('?f=html'), 'application/json')).toBe('html');
		expect(chooseFormat(url('?f=json'), 'text/html')).toBe('json');
		expect(chooseFormat(url('?f=xml'), null)).toMatchObject({ status: 400 });
	});

	it('HTML only when the Accept header prefers it over JSON (browsers), JSON otherwise', () => {
		const browser = 'text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8';
		expect(chooseFormat(url(), browser)).toBe('html');
		expect(chooseFormat(url(), 'application/geo+json, application/json')).toBe('json');
		expect(chooseFormat(url(), '*/*')).toBe('json');
		expect(chooseFormat(url(), null)).toBe('json');
		expect(chooseFormat(url(), 'text/html;q=0.5, application/json')).toBe('json');
		expect(chooseFormat(url(), 'text/*, application/json;q=0.2')).toBe('html');
	});
});

describe('ETag and If-None-Match (RFC 9110 weak comparison)', () => {
	it('the same content gets the same tag, other content another', () => {
		expect(etagOf('a')).toBe(etagOf('a'));
		expect(etagOf('a')).not.toBe(etagOf('b'));
		expect(etagOf('a')).toMatch(/^W\/"[\w-]+"$/);
	});

	it('matches a listed tag with or without W/, and *', () => {
		const tag = etagOf('a');
		expect(notModified(tag, tag)).toBe(true);
		expect(notModified(`"x", ${tag.slice(2)}`, tag)).toBe(true);
		expect(notModified('*', tag)).toBe(true);
		expect(notModified(etagOf('b'), tag)).toBe(false);
		expect(notModified(null, tag)).toBe(false);
	});

	it('answers 304 without a body to a matching If-None-Match', async () => {
		const tag = etagOf('{}');
		const res = contentResponse(
			new Request('http://x/ogc', { headers: { 'if-none-match': tag } }),
			'{}',
			'application/json',
			tag
		);
		expect(res.status).toBe(304);
		expect(await res.text()).toBe('');
		expect(res.headers.get('etag')).toBe(tag);
	});
});

describe('CORS: read-only, never with credentials', () => {
	it('a preflight allows GET, HEAD and OPTIONS from any origin, without credentials', () => {
		const res = preflight();
		expect(res.status).toBe(204);
		expect(res.headers.get('access-control-allow-origin')).toBe('*');
		expect(res.headers.get('access-control-allow-methods')).toBe('GET, HEAD, OPTIONS');
		expect(res.headers.has('access-control-allow-credentials')).toBe(false);
	});
});

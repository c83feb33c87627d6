import { describe, expect, it } from 'vitest';
import {
	asUnavailable,
	DATABASE_DOWN_MESSAGE,
	databaseDownResponse,
	isDatabaseUnavailable
} from './database-down';

describe('isDatabaseUnavailable', () => {
	it('recognises the driver and server codes, also when wrapped', () => {
		expect(isDatabaseUnavailable({ code: 'CONNECTION_CLOSED' })).toBe(true);
		expect(isDatabaseUnavailable({ code: '57P01' })).toBe(true);
		const wrapped = new Error('Failed query', { cause: { code: 'CONNECT_TIMEOUT' } });
		expect(isDatabaseUnavailable(new Error('outer', { cause: wrapped }))).toBe(true);
	});

	it('counts a network failure only under a failed database query', () => {
		const refused = Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' });
		const failedQuery = Object.assign(new Error('Failed query'), {
			query: 'select 1',
			cause: refused
		});
		expect(isDatabaseUnavailable(new Error('auth', { cause: failedQuery }))).toBe(true);
		expect(
			isDatabaseUnavailable(
				Object.assign(new Error('Failed query'), {
					query: 'select 1',
					cause: new AggregateError([{ code: 'ECONNREFUSED' }])
				})
			)
		).toBe(true);
		// The object store or the mail server refusing is not the database.
		expect(isDatabaseUnavailable(refused)).toBe(false);
	});

	it('leaves other failures alone (they stay 500s or 4xx)', () => {
		expect(isDatabaseUnavailable(new Error('boom'))).toBe(false);
		expect(isDatabaseUnavailable({ code: '23505', query: 'insert' })).toBe(false);
		expect(isDatabaseUnavailable(null)).toBe(false);
		expect(isDatabaseUnavailable('ECONNREFUSED')).toBe(false);
	});
});

describe('503 answers', () => {
	it('JSON for the API, plain text for pages, with Retry-After', async () => {
		const api = databaseDownResponse('/api/v1/sites');
		expect(api.status).toBe(503);
		expect(api.headers.get('retry-after')).toBe('30');
		expect(await api.json()).toEqual({
			error: { code: 'database_unavailable', message: DATABASE_DOWN_MESSAGE, details: {} }
		});
		const health = databaseDownResponse('/api/health');
		expect(await health.json()).toEqual({ message: DATABASE_DOWN_MESSAGE });
		const page = databaseDownResponse('/datasets');
		expect(page.headers.get('content-type')).toMatch(/^text\/plain/);
		expect(await page.text()).toBe(DATABASE_DOWN_MESSAGE);
	});

	it('turns a rendered 500 into a 503 keeping body and headers', async () => {
		const rendered = new Response('<p>page</p>', {
			status: 500,
			headers: { 'content-type': 'text/html', 'x-frame-options': 'DENY' }
		});
		const out = asUnavailable(rendered);
		expect(out.status).toBe(503);
		expect(out.headers.get('x-frame-options')).toBe('DENY');
		expect(out.headers.get('retry-after')).toBe('30');
		expect(await out.text()).toBe('<p>page</p>');
	});
});

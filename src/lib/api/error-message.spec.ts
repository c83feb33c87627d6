import { describe, expect, it } from 'vitest';
import { apiErrorMessage, errorMessageOf } from './error-message';

describe('errorMessageOf / apiErrorMessage', () => {
	it('reads the message of the one error body', async () => {
		const body = { error: { code: 'not_found', message: 'Not found.', details: {} } };
		expect(errorMessageOf(body, 'x')).toBe('Not found.');
		const res = new Response(JSON.stringify(body), { status: 404, statusText: 'Not Found' });
		expect(await apiErrorMessage(res)).toBe('Not found.');
	});

	it('falls back to the status line for other bodies', async () => {
		expect(errorMessageOf({ message: 'old shape' }, 'fallback')).toBe('fallback');
		expect(errorMessageOf(null, 'fallback')).toBe('fallback');
		const res = new Response('<html>', { status: 502, statusText: 'Bad Gateway' });
		expect(await apiErrorMessage(res)).toBe('502 Bad Gateway');
	});
});

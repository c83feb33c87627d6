import { describe, expect, it } from 'vitest';
import { safeHttpUrl } from './safe-url';
import { organisationSchema, websiteSchema } from './schemas/organisation';

// Which schemes are script-capable: WHATWG URL Standard and OWASP XSS Prevention Cheat Sheet
// (rule: only allow http/https in user-supplied href), from memory.
describe('safeHttpUrl', () => {
	it.each([
		['https://korvald.example', 'https://korvald.example'],
		['  http://korvald.example/about?x=1  ', 'http://korvald.example/about?x=1'],
		['HTTPS://KORVALD.EXAMPLE', 'HTTPS://KORVALD.EXAMPLE']
	])('keeps %j', (input, expected) => {
		expect(safeHttpUrl(input)).toBe(expected);
	});

	it.each([
		'javascript:alert(document.cookie)//',
		'JavaScript:alert(1)',
		'java\tscript:alert(1)',
		' javascript:alert(1)',
		'data:text/html,<script>alert(1)</script>',
		'vbscript:msgbox(1)',
		'//evil.example/',
		'/relative/path',
		'https://trusted.example@evil.example/',
		'https://localhost',
		'https://exa mple.org',
		'https://example.org/\u0000',
		'ftp://example.org',
		'',
		null,
		42
	])('refuses %j', (input) => {
		expect(safeHttpUrl(input)).toBeNull();
	});
});

describe('websiteSchema (form and better-auth hooks)', () => {
	it('refuses a javascript: address with a message for the form', () => {
		const r = websiteSchema.safeParse('javascript:alert(document.cookie)//');
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toMatch(/https:\/\//);
	});

	it('lets the form leave the website empty', () => {
		const r = organisationSchema.parse({ name: 'Test org', slug: 'test-org', website: '  ' });
		expect(r.website).toBeUndefined();
	});
});

import { describe, expect, it } from 'vitest';
import { statusLabel } from './status';

describe('statusLabel', () => {
	it('reads "Superseded" for a published version a newer one replaced', () => {
		expect(statusLabel({ status: 'published', supersededById: 'b' })).toBe('Superseded');
		expect(statusLabel({ status: 'published', supersededById: null })).toBe('Published');
		expect(statusLabel({ status: 'published' })).toBe('Published');
	});

	it('keeps the other states (a retired version stays "Retired", superseded or not)', () => {
		expect(statusLabel({ status: 'retired', supersededById: 'b' })).toBe('Retired');
		expect(statusLabel({ status: 'in_review' })).toBe('In review');
		expect(statusLabel({ status: 'unknown-state' })).toBe('unknown-state');
	});
});

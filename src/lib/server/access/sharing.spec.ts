import { describe, expect, it } from 'vitest';
import { utcDay } from '../clock';
import { embargoDateRefusal, expiryRefusal, shareable } from './sharing';

const AT = new Date('2026-12-02T23:30:00Z');

describe('embargoDateRefusal', () => {
	it('refuses a new embargo ending before today (UTC), accepts today and later', () => {
		const refusal = 'The release date of a new embargo cannot be in the past.';
		expect(
			embargoDateRefusal(null, { visibility: 'embargoed', embargoUntil: '2026-12-01' }, AT)
		).toBe(refusal);
		expect(
			embargoDateRefusal(null, { visibility: 'embargoed', embargoUntil: '2026-12-02' }, AT)
		).toBeNull();
		expect(
			embargoDateRefusal(null, { visibility: 'embargoed', embargoUntil: '2027-01-01' }, AT)
		).toBeNull();
		// A private dataset turned embargoed with a past date is a new embargo too.
		expect(
			embargoDateRefusal(
				{ visibility: 'private', embargoUntil: '2026-11-01' },
				{ visibility: 'embargoed', embargoUntil: '2026-11-01' },
				AT
			)
		).toBe(refusal);
		// So is moving the date of an existing embargo into the past.
		expect(
			embargoDateRefusal(
				{ visibility: 'embargoed', embargoUntil: '2027-01-01' },
				{ visibility: 'embargoed', embargoUntil: '2026-01-01' },
				AT
			)
		).toBe(refusal);
	});

	it('leaves an unchanged embargo and other visibilities alone', () => {
		const old = { visibility: 'embargoed', embargoUntil: '2026-01-01' };
		expect(embargoDateRefusal(old, { ...old }, AT)).toBeNull();
		expect(
			embargoDateRefusal(null, { visibility: 'public', embargoUntil: '2001-01-01' }, AT)
		).toBeNull();
	});
});

describe('expiryRefusal and utcDay', () => {
	it('takes the day in UTC, whatever the local time zone', () => {
		expect(utcDay(new Date('2026-12-02T23:59:59-05:00'))).toBe('2026-12-03');
	});

	it('refuses a last day of access before today, accepts today and none', () => {
		expect(expiryRefusal('2026-12-01', AT)).toBe('The last day of access cannot be in the past.');
		expect(expiryRefusal('2026-12-02', AT)).toBeNull();
		expect(expiryRefusal(null, AT)).toBeNull();
	});
});

describe('shareable', () => {
	it('is true for published or retired restricted and embargoed datasets only', () => {
		expect(shareable({ organisationId: 'o', status: 'published', visibility: 'restricted' })).toBe(
			true
		);
		expect(shareable({ organisationId: 'o', status: 'retired', visibility: 'embargoed' })).toBe(
			true
		);
		expect(shareable({ organisationId: 'o', status: 'draft', visibility: 'restricted' })).toBe(
			false
		);
		expect(shareable({ organisationId: 'o', status: 'published', visibility: 'private' })).toBe(
			false
		);
		expect(shareable({ organisationId: 'o', status: 'published', visibility: 'public' })).toBe(
			false
		);
	});
});

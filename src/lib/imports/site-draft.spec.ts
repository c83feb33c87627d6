import { describe, expect, expectTypeOf, it } from 'vitest';
import type { NewSite } from '../server/db/schema/sites';
import type { SiteDraft } from './site-draft';

describe('SiteDraft', () => {
	it('is assignable to the site table insert type without datasetId (type-level check)', () => {
		type Insertable = Omit<NewSite, 'datasetId'>;
		expectTypeOf<SiteDraft>().toExtend<Insertable>();
		const keys: (keyof SiteDraft)[] = ['code', 'location', 'qualityClass'];
		expect(keys.length).toBe(3);
	});
});

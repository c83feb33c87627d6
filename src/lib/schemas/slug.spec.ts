import { describe, expect, it } from 'vitest';
import { organisationSchema } from './organisation';
import { suggestSlug } from './slug';

describe('suggestSlug', () => {
	it.each([
		['Korvald Geological Survey', 'korvald-geological-survey'],
		['Institut für Geothermie & Erdwärme', 'institut-fur-geothermie-erdwarme'],
		['  Øst–Vest  Heat (2026) ', 'ost-vest-heat-2026'],
		['Ærø Borehole Group', 'aero-borehole-group']
	])('%s → %s', (name, slug) => {
		expect(suggestSlug(name)).toBe(slug);
	});

	it('always passes the slug rule for names of three or more letters', () => {
		for (const name of [
			'Abc',
			'A very long organisation name that goes on and on and on forever'
		]) {
			const slug = suggestSlug(name);
			expect(organisationSchema.shape.slug.safeParse(slug).success, slug).toBe(true);
		}
	});
});

import { asc } from 'drizzle-orm';
import type { Db } from '../db/client';
import { organisation } from '../db/schema';

/** The public directory of organisations (names and descriptions are public by design). */
export async function listOrganisations(db: Db) {
	return db
		.select({
			id: organisation.id,
			name: organisation.name,
			slug: organisation.slug,
			country: organisation.country,
			website: organisation.website,
			description: organisation.description
		})
		.from(organisation)
		.orderBy(asc(organisation.name));
}

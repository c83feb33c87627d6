import { sql } from 'drizzle-orm';
import {
	check,
	customType,
	index,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import { user } from './auth';
import { organisation } from './organisations';

/**
 * PostGIS `geometry(Polygon,4326)`. Written and read through SQL (ST_GeomFromGeoJSON,
 * ST_AsGeoJSON in repositories/saved-regions.ts), so the driver value stays PostgreSQL's text.
 */
const polygonWgs84 = customType<{ data: string; driverData: string }>({
	dataType() {
		return 'geometry(Polygon,4326)';
	}
});

/**
 * A named map region of one user (migration 0018). With `organisationId` it is shared with that
 * organisation's members (who may pick it, not change it); who sees which region is decided in
 * access/regions.ts.
 */
export const savedRegion = pgTable(
	'saved_region',
	{
		id: uuid().primaryKey().defaultRandom(),
		ownerId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		organisationId: text().references(() => organisation.id, { onDelete: 'set null' }),
		name: text().notNull(),
		outline: polygonWgs84().notNull(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		uniqueIndex('saved_region_owner_name_idx').on(t.ownerId, sql`lower(btrim(${t.name}))`),
		index('saved_region_organisation_idx').on(t.organisationId),
		check('saved_region_name_length', sql`char_length(btrim(${t.name})) BETWEEN 1 AND 80`),
		check('saved_region_outline_valid', sql`ST_IsValid(${t.outline})`)
	]
);

export type SavedRegionRow = typeof savedRegion.$inferSelect;

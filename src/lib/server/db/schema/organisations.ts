import { pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * A survey organisation, university group or company that publishes datasets. The first columns
 * follow the organisation model of the auth library used for membership (id, name, slug, logo,
 * metadata, createdAt), so its plugin can use this table directly.
 */
export const organisation = pgTable('organisation', {
	id: text().primaryKey(),
	name: text().notNull(),
	slug: text().notNull().unique(),
	logo: text(),
	metadata: text(),
	country: text(),
	website: text(),
	description: text(),
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
});

export type Organisation = typeof organisation.$inferSelect;
export type NewOrganisation = typeof organisation.$inferInsert;

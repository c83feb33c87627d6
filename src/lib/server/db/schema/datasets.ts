import { date, integer, pgEnum, pgTable, text, timestamp, uuid, index } from 'drizzle-orm/pg-core';
import { organisation } from './organisations';

export const datasetStatus = pgEnum('dataset_status', [
	'draft',
	'in_review',
	'returned',
	'published',
	'retired'
]);

export const datasetVisibility = pgEnum('dataset_visibility', [
	'public',
	'embargoed',
	'restricted',
	'private'
]);

/** A versioned collection of sites published by one organisation under one licence. */
export const dataset = pgTable(
	'dataset',
	{
		id: uuid().primaryKey().defaultRandom(),
		organisationId: text()
			.notNull()
			.references(() => organisation.id, { onDelete: 'cascade' }),
		title: text().notNull(),
		abstract: text().notNull().default(''),
		keywords: text().array().notNull().default([]),
		/** SPDX licence identifier, or 'proprietary'. */
		licence: text().notNull(),
		citation: text().notNull().default(''),
		doi: text(),
		version: integer().notNull().default(1),
		status: datasetStatus().notNull().default('draft'),
		visibility: datasetVisibility().notNull().default('private'),
		/** Visible to the public from this date when visibility is 'embargoed'. */
		embargoUntil: date({ mode: 'string' }),
		createdBy: text(),
		updatedBy: text(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('dataset_organisation_idx').on(t.organisationId)]
);

export type Dataset = typeof dataset.$inferSelect;
export type NewDataset = typeof dataset.$inferInsert;

import {
	date,
	integer,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uuid,
	index,
	uniqueIndex,
	type AnyPgColumn
} from 'drizzle-orm/pg-core';
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
		/** Authors as they appear in the citation; the organisation's name when empty. */
		authors: text().notNull().default(''),
		/** A note users should add when citing it (the generated citation is datasets/citation.ts). */
		citation: text().notNull().default(''),
		doi: text(),
		version: integer().notNull().default(1),
		status: datasetStatus().notNull().default('draft'),
		visibility: datasetVisibility().notNull().default('private'),
		/** Visible to the public from this date when visibility is 'embargoed'. */
		embargoUntil: date({ mode: 'string' }),
		/** The published version this one corrects (a new version starts as a draft copy of it). */
		previousVersionId: uuid().references((): AnyPgColumn => dataset.id),
		/** Set when a newer version is published; the dataset stays readable and citable. */
		supersededById: uuid().references((): AnyPgColumn => dataset.id),
		/** When it was published (the year of its citation). */
		publishedAt: timestamp({ withTimezone: true }),
		createdBy: text(),
		updatedBy: text(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('dataset_organisation_idx').on(t.organisationId),
		uniqueIndex('dataset_previous_version_idx').on(t.previousVersionId)
	]
);

export type Dataset = typeof dataset.$inferSelect;
export type NewDataset = typeof dataset.$inferInsert;

import { sql } from 'drizzle-orm';
import {
	bigint,
	doublePrecision,
	integer,
	pgTable,
	primaryKey,
	smallint,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import { dataset } from './datasets';

/**
 * Per-dataset map cells at zooms 0-9 (migration 0015, which also holds the triggers that mark a
 * dataset stale and the function map_cell_refresh); read by repositories/map-cells.ts.
 */
export const mapCell = pgTable(
	'map_cell',
	{
		datasetId: uuid()
			.notNull()
			.references(() => dataset.id, { onDelete: 'cascade' }),
		zoom: smallint().notNull(),
		ix: integer().notNull(),
		iy: integer().notNull(),
		count: integer().notNull(),
		withValue: integer().notNull(),
		sumMWm2: doublePrecision('sum_mw_m2'),
		minMWm2: doublePrecision('min_mw_m2'),
		maxMWm2: doublePrecision('max_mw_m2')
	},
	(t) => [primaryKey({ name: 'map_cell_pkey', columns: [t.zoom, t.ix, t.iy, t.datasetId] })]
);

/** Datasets whose sites changed since their cells were built (answered from their sites). */
export const mapCellStale = pgTable('map_cell_stale', {
	datasetId: uuid().primaryKey(),
	markedAt: timestamp({ withTimezone: true })
		.notNull()
		.default(sql`now()`)
});

/**
 * A change counter per dataset (migration 0016): bumped from one sequence by the triggers on
 * site and temperature_log; the map's in-memory site index (server/map-index) compares it.
 */
export const mapSiteVersion = pgTable('map_site_version', {
	datasetId: uuid().primaryKey(),
	version: bigint({ mode: 'number' }).notNull()
});

import { sql } from 'drizzle-orm';
import {
	customType,
	doublePrecision,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
// Relative, not $lib: drizzle-kit and the seed load the schema outside SvelteKit.
import { GRID_STATUSES } from '../../../grids/status';

export const gridStatus = pgEnum('grid_status', GRID_STATUSES);

/** Raw cell values (Float32, little-endian, row-major, south row first) in PostgreSQL bytea. */
const float32Cells = customType<{ data: Buffer; driverData: Buffer }>({
	dataType: () => 'bytea'
});

/**
 * One interpolated heat-flow grid: the request, the exact sites it was computed from (so the job
 * is reproducible after a restart and the cache can be checked) and, once done, its cells.
 * `input_hash` covers the request and every site value used, so it changes with the visible
 * data; the partial unique index makes two identical requests share one job.
 */
export const grid = pgTable(
	'grid',
	{
		id: uuid().primaryKey().defaultRandom(),
		inputHash: text().notNull(),
		status: gridStatus().notNull().default('queued'),
		/** 0–1. */
		progress: doublePrecision().notNull().default(0),
		/**
		 * Which run of the job owns the row: a run that pg-boss re-queued after its expiry (a killed
		 * or very slow worker) supersedes the earlier one, whose writes then match no row and stop it.
		 */
		attempt: integer().notNull().default(0),
		error: text(),
		request: jsonb().$type<Record<string, unknown>>().notNull(),
		/** Computation CRS and grid geometry. */
		plan: jsonb().$type<Record<string, unknown>>().notNull(),
		/** The sites used: lon, lat, projected x/y, heat flow and σ, dataset. */
		samples: jsonb().$type<unknown[]>().notNull(),
		/** Datasets whose sites shaped the grid: a viewer must see all of them to read it. */
		datasetIds: uuid().array().notNull(),
		result: jsonb().$type<Record<string, unknown>>(),
		valueCells: float32Cells('value_f32'),
		sigmaCells: float32Cells('sigma_f32'),
		requestedBy: text(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		finishedAt: timestamp({ withTimezone: true })
	},
	(t) => [
		uniqueIndex('grid_input_hash_live_idx')
			.on(t.inputHash)
			.where(sql`${t.status} <> 'failed'`),
		index('grid_created_idx').on(t.createdAt)
	]
);

export type Grid = typeof grid.$inferSelect;

import { sql } from 'drizzle-orm';
import {
	type AnyPgColumn,
	doublePrecision,
	index,
	integer,
	pgEnum,
	pgTable,
	smallint,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
// Relative, not $lib: drizzle-kit and the seed load the schema outside SvelteKit.
import { QUALITY_CLASSES } from '../../../sites/quality';
import { pointWgs84 } from '../point';
import { dataset } from './datasets';
import { heatFlowMethod } from './heat-flow-method';
import { siteValueRevision } from './site-values';
// A cycle with files.ts is fine: references are resolved lazily.
import { importBatch } from './files';
import type { SiteFlag } from '../../../sites/flags';

// In its own module so site-values.ts can use it without an import cycle through this file.
export { heatFlowMethod };

/** The product's own quality classes (defined in sites/quality.ts, the one list). */
export const qualityClassEnum = pgEnum('quality_class', QUALITY_CLASSES);

/**
 * One heat-flow determination at a place. Values are stored in SI-derived display units named in
 * each column (mW/m², K/km, W/m/K, µW/m³, °C, m); uncertainties are one standard deviation.
 */
export const site = pgTable(
	'site',
	{
		id: uuid().primaryKey().defaultRandom(),
		datasetId: uuid()
			.notNull()
			.references(() => dataset.id, { onDelete: 'cascade' }),
		code: text().notNull(),
		name: text(),
		location: pointWgs84().notNull(),
		/** Coordinates exactly as entered, in the CRS given by originalEpsg. */
		originalX: doublePrecision(),
		originalY: doublePrecision(),
		originalEpsg: integer(),
		elevationM: doublePrecision(),
		waterDepthM: doublePrecision(),
		topDepthM: doublePrecision(),
		bottomDepthM: doublePrecision(),
		heatFlowMWm2: doublePrecision('heat_flow_mw_m2'),
		heatFlowSigmaMWm2: doublePrecision('heat_flow_sigma_mw_m2'),
		gradientKPerKm: doublePrecision(),
		gradientSigmaKPerKm: doublePrecision(),
		conductivityWmK: doublePrecision('conductivity_w_mk'),
		conductivitySigmaWmK: doublePrecision('conductivity_sigma_w_mk'),
		conductivitySamples: integer(),
		conductivityMethod: text(),
		heatProductionUWm3: doublePrecision('heat_production_uw_m3'),
		heatProductionSigmaUWm3: doublePrecision('heat_production_sigma_uw_m3'),
		surfaceTemperatureC: doublePrecision(),
		method: heatFlowMethod().notNull().default('other'),
		corrections: text().array().notNull().default([]),
		yearMeasured: smallint(),
		remarks: text(),
		/** The product's own quality class, computed from uncertainty, method and sample count. */
		qualityClass: qualityClassEnum(),
		/** The revision whose values the columns above hold; null while only the submitted values exist. */
		currentRevisionId: uuid().references((): AnyPgColumn => siteValueRevision.id, {
			onDelete: 'set null'
		}),
		/** Warnings imported anyway (`src/lib/sites/flags.ts`); a map filter can use them. */
		flags: text().array().$type<SiteFlag[]>().notNull().default([]),
		/** The import that created the site (its file, corrections and exclusions), if any. */
		importBatchId: uuid().references((): AnyPgColumn => importBatch.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		uniqueIndex('site_dataset_code_idx').on(t.datasetId, t.code),
		index('site_location_gist').using('gist', t.location),
		index('site_flags_gin').using('gin', t.flags),
		// Distance searches in metres cast to geography; a plain geometry index is not used for them.
		index('site_location_geog_gist').using('gist', sql`(${t.location}::geography)`),
		// Map search by the start of a code or name (lower(…) LIKE 'abc%'), migration 0011.
		index('site_code_lower_prefix_idx').using('btree', sql`lower(${t.code}) text_pattern_ops`),
		index('site_name_lower_prefix_idx').using('btree', sql`lower(${t.name}) text_pattern_ops`)
	]
);

export type Site = typeof site.$inferSelect;
export type NewSite = typeof site.$inferInsert;

import { sql } from 'drizzle-orm';
import {
	check,
	doublePrecision,
	index,
	integer,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
// Relative, not $lib: drizzle-kit and the seed load the schema outside SvelteKit.
import { SITE_VALUE_SOURCES } from '../../../sites/revisions';
import { user } from './auth';
import { importBatch } from './files';
import { siteComputation } from './site-data';
import { heatFlowMethod } from './heat-flow-method';
import { site } from './sites';

/** Where a revision of a site's values came from (the one list is in src/lib/sites/revisions.ts). */
export const siteValueSource = pgEnum('site_value_source', SITE_VALUE_SOURCES);

/**
 * One version of a site's heat-flow values with its provenance. The site row keeps the current
 * values (and `currentRevisionId`), so maps and queries need no join; a revision is copied onto the
 * site when it is chosen. The values as submitted become the `submitted` revision (at most one per
 * site) the first time anything else is added.
 */
export const siteValueRevision = pgTable(
	'site_value_revision',
	{
		id: uuid().primaryKey().defaultRandom(),
		siteId: uuid()
			.notNull()
			.references(() => site.id, { onDelete: 'cascade' }),
		source: siteValueSource().notNull(),
		heatFlowMWm2: doublePrecision('heat_flow_mw_m2'),
		heatFlowSigmaMWm2: doublePrecision('heat_flow_sigma_mw_m2'),
		gradientKPerKm: doublePrecision(),
		gradientSigmaKPerKm: doublePrecision(),
		conductivityWmK: doublePrecision('conductivity_w_mk'),
		conductivitySigmaWmK: doublePrecision('conductivity_sigma_w_mk'),
		conductivitySamples: integer(),
		topDepthM: doublePrecision(),
		bottomDepthM: doublePrecision(),
		method: heatFlowMethod().notNull(),
		/** The import that stored the submitted values, when it can be told. */
		importBatchId: uuid().references(() => importBatch.id, { onDelete: 'set null' }),
		/** The log computation this revision holds. */
		computationId: uuid().references(() => siteComputation.id, { onDelete: 'set null' }),
		/** Why a manual correction was made (required for corrections). */
		reason: text(),
		createdBy: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('site_value_revision_site_idx').on(t.siteId, t.createdAt),
		uniqueIndex('site_value_revision_one_submitted_idx')
			.on(t.siteId)
			.where(sql`${t.source} = 'submitted'`),
		check(
			'site_value_revision_reason',
			sql`${t.source} <> 'correction' OR length(btrim(coalesce(${t.reason}, ''))) > 0`
		)
	]
);

export type SiteValueRevision = typeof siteValueRevision.$inferSelect;

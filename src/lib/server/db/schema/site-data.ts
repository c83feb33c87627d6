import { sql } from 'drizzle-orm';
import {
	check,
	doublePrecision,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
// Relative, not $lib: drizzle-kit and the seed load the schema outside SvelteKit.
import { SITE_COMPUTATION_KINDS } from '../../../sites/computations';
import { user } from './auth';
import { site } from './sites';

/** A temperature log of a site: depths (m, increasing) and temperatures (°C) as parallel arrays. */
export const temperatureLog = pgTable(
	'temperature_log',
	{
		id: uuid().primaryKey().defaultRandom(),
		siteId: uuid()
			.notNull()
			.references(() => site.id, { onDelete: 'cascade' }),
		name: text().notNull(),
		sourceFileName: text(),
		depthM: doublePrecision().array().notNull(),
		temperatureC: doublePrecision().array().notNull(),
		createdBy: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('temperature_log_site_idx').on(t.siteId)]
);

/** A conductivity measurement over a depth interval of a site (W/m/K, 1-σ). */
export const conductivitySample = pgTable(
	'conductivity_sample',
	{
		id: uuid().primaryKey().defaultRandom(),
		siteId: uuid()
			.notNull()
			.references(() => site.id, { onDelete: 'cascade' }),
		topM: doublePrecision().notNull(),
		bottomM: doublePrecision().notNull(),
		conductivityWmK: doublePrecision('conductivity_w_mk').notNull(),
		sigmaWmK: doublePrecision('sigma_w_mk'),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('conductivity_sample_site_idx').on(t.siteId)]
);

export const logMethod = pgEnum('log_heat_flow_method', ['interval', 'bullard']);

/** What a site computation computed (the one list is in src/lib/sites/computations.ts). */
export const siteComputationKind = pgEnum('site_computation_kind', SITE_COMPUTATION_KINDS);

/**
 * A computation on a site's data by the thermal core, with what it was computed from: heat flow
 * from a log (typed columns, checked present for that kind), and the Horner bottom-hole
 * temperature, palaeoclimate correction and heat production (their inputs and result as JSON,
 * shaped by src/lib/sites/computations.ts).
 */
export const siteComputation = pgTable(
	'site_computation',
	{
		id: uuid().primaryKey().defaultRandom(),
		siteId: uuid()
			.notNull()
			.references(() => site.id, { onDelete: 'cascade' }),
		kind: siteComputationKind().notNull().default('heat_flow'),
		logId: uuid().references(() => temperatureLog.id, { onDelete: 'set null' }),
		method: logMethod(),
		fromM: doublePrecision(),
		toM: doublePrecision(),
		heatFlowMWm2: doublePrecision('heat_flow_mw_m2'),
		sigmaMWm2: doublePrecision('sigma_mw_m2'),
		gradientKPerKm: doublePrecision(),
		sigmaGradientKPerKm: doublePrecision(),
		meanConductivityWmK: doublePrecision('mean_conductivity_w_mk'),
		samples: integer(),
		inputs: jsonb().$type<Record<string, unknown>>().notNull().default({}),
		result: jsonb().$type<Record<string, unknown>>().notNull().default({}),
		/** Version of Thermalith's thermal core that computed it. */
		engineVersion: text().notNull(),
		createdBy: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('site_computation_site_idx').on(t.siteId),
		check(
			'site_computation_heat_flow_columns',
			sql`${t.kind} <> 'heat_flow' OR (${t.method} IS NOT NULL AND ${t.fromM} IS NOT NULL AND ${t.toM} IS NOT NULL AND ${t.heatFlowMWm2} IS NOT NULL AND ${t.sigmaMWm2} IS NOT NULL AND ${t.gradientKPerKm} IS NOT NULL AND ${t.sigmaGradientKPerKm} IS NOT NULL AND ${t.meanConductivityWmK} IS NOT NULL AND ${t.samples} IS NOT NULL)`
		)
	]
);

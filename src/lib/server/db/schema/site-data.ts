import {
	doublePrecision,
	index,
	integer,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
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

/** Heat flow computed from a log by the thermal core, with what it was computed from. */
export const heatFlowComputation = pgTable(
	'heat_flow_computation',
	{
		id: uuid().primaryKey().defaultRandom(),
		siteId: uuid()
			.notNull()
			.references(() => site.id, { onDelete: 'cascade' }),
		logId: uuid().references(() => temperatureLog.id, { onDelete: 'set null' }),
		method: logMethod().notNull(),
		fromM: doublePrecision().notNull(),
		toM: doublePrecision().notNull(),
		heatFlowMWm2: doublePrecision('heat_flow_mw_m2').notNull(),
		sigmaMWm2: doublePrecision('sigma_mw_m2').notNull(),
		gradientKPerKm: doublePrecision().notNull(),
		sigmaGradientKPerKm: doublePrecision().notNull(),
		meanConductivityWmK: doublePrecision('mean_conductivity_w_mk').notNull(),
		samples: integer().notNull(),
		/** Version of Thermalith's thermal core that computed it. */
		engineVersion: text().notNull(),
		createdBy: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('heat_flow_computation_site_idx').on(t.siteId)]
);

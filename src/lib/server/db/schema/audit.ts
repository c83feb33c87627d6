import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/**
 * Append-only record of who did what and when. No foreign keys on purpose: deleting a user,
 * dataset or organisation must not rewrite or remove history. A trigger (migration
 * 0005_audit_append_only) refuses UPDATE, DELETE and TRUNCATE.
 */
export const auditEvent = pgTable(
	'audit_event',
	{
		id: uuid().primaryKey().defaultRandom(),
		at: timestamp({ withTimezone: true }).notNull().defaultNow(),
		/** User id of whoever acted; null for the system (scheduled jobs). */
		actorId: text(),
		/** Name and address at the time, so the record still reads after the account changes. */
		actorName: text(),
		actorEmail: text(),
		/** create, edit, submit, return, publish, retire, release, request, grant, decline, revoke, … */
		action: text().notNull(),
		organisationId: text(),
		datasetId: uuid(),
		details: jsonb().$type<Record<string, unknown>>().notNull().default({})
	},
	(t) => [
		index('audit_event_dataset_idx').on(t.datasetId, t.at),
		index('audit_event_organisation_idx').on(t.organisationId, t.at),
		index('audit_event_at_idx').on(t.at)
	]
);

export type AuditEvent = typeof auditEvent.$inferSelect;

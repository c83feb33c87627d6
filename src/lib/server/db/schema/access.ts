import { sql } from 'drizzle-orm';
import {
	check,
	date,
	index,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import { user } from './auth';
import { dataset } from './datasets';
import { organisation } from './organisations';

/**
 * Access to one restricted or embargoed dataset for one user or one organisation (exactly one of
 * the two). A revoked grant keeps its row (revokedAt) so the dataset page can show who had access;
 * an expired one (expiresOn before today) stops working in the rule of access/visibility.ts
 * without anyone acting.
 */
export const accessGrant = pgTable(
	'access_grant',
	{
		id: uuid().primaryKey().defaultRandom(),
		datasetId: uuid()
			.notNull()
			.references(() => dataset.id, { onDelete: 'cascade' }),
		userId: text().references(() => user.id, { onDelete: 'cascade' }),
		organisationId: text().references(() => organisation.id, { onDelete: 'cascade' }),
		/** Last day of access (UTC, inclusive); null: until revoked. */
		expiresOn: date({ mode: 'string' }),
		grantedBy: text(),
		grantedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		/** The request it answered, if any. */
		requestId: uuid(),
		revokedBy: text(),
		revokedAt: timestamp({ withTimezone: true })
	},
	(t) => [
		index('access_grant_dataset_idx').on(t.datasetId),
		index('access_grant_user_idx').on(t.userId),
		index('access_grant_organisation_idx').on(t.organisationId),
		check('access_grant_one_grantee', sql`(${t.userId} IS NULL) <> (${t.organisationId} IS NULL)`)
	]
);

export const ACCESS_REQUEST_STATES = ['pending', 'approved', 'declined'] as const;
export const accessRequestStatus = pgEnum('access_request_status', ACCESS_REQUEST_STATES);

/** A signed-in user's request for access to a dataset, with their purpose; answered once. */
export const accessRequest = pgTable(
	'access_request',
	{
		id: uuid().primaryKey().defaultRandom(),
		datasetId: uuid()
			.notNull()
			.references(() => dataset.id, { onDelete: 'cascade' }),
		requesterId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		purpose: text().notNull(),
		status: accessRequestStatus().notNull().default('pending'),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		decidedBy: text(),
		decidedAt: timestamp({ withTimezone: true }),
		/** Why it was declined (required then). */
		reason: text()
	},
	(t) => [
		index('access_request_dataset_idx').on(t.datasetId, t.status),
		// One open request per person and dataset.
		uniqueIndex('access_request_one_pending')
			.on(t.datasetId, t.requesterId)
			.where(sql`${t.status} = 'pending'`)
	]
);

export type AccessGrant = typeof accessGrant.$inferSelect;
export type AccessRequest = typeof accessRequest.$inferSelect;

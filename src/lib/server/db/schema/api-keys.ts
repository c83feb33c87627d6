import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';

/**
 * Personal API keys. Only a SHA-256 hash of the key is stored (the key itself is shown once, at
 * creation); `prefix` is its first characters, so the owner can tell keys apart. A key acts as its
 * owner with the scopes given: `read` (GET) and `write` (changes).
 */
export const apiKey = pgTable(
	'api_key',
	{
		id: uuid().primaryKey().defaultRandom(),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		name: text().notNull(),
		prefix: text().notNull(),
		keyHash: text().notNull().unique(),
		scopes: text().array().notNull(),
		/** Requests allowed per minute (a fixed window counted in rate_limit). */
		ratePerMinute: integer().notNull().default(600),
		expiresAt: timestamp({ withTimezone: true }),
		lastUsedAt: timestamp({ withTimezone: true }),
		revokedAt: timestamp({ withTimezone: true }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('api_key_user_idx').on(t.userId)]
);

export type ApiKeyRow = typeof apiKey.$inferSelect;

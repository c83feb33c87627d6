import { index, pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core';

/** One failed password sign-in, counted by the sign-in guard (src/lib/server/auth/sign-in-guard.ts). */
export const signInFailure = pgTable(
	'sign_in_failure',
	{
		id: serial().primaryKey(),
		email: text().notNull(),
		at: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('sign_in_failure_email_at_idx').on(t.email, t.at)]
);

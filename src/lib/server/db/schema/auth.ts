import { relations } from 'drizzle-orm';
import { bigint, boolean, index, integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { organisation } from './organisations';

/*
 * Tables of better-auth (core, organization and admin plugins), written to match what its CLI
 * generates (see scripts/auth-cli-config.ts) so its Drizzle adapter can use them. Property names
 * are the library's field names; columns are snake_case like every other table.
 */
const timestamps = {
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
	updatedAt: timestamp({ withTimezone: true })
		.notNull()
		.defaultNow()
		.$onUpdate(() => new Date())
};

export const user = pgTable('user', {
	id: text().primaryKey(),
	name: text().notNull(),
	email: text().notNull().unique(),
	emailVerified: boolean().notNull().default(false),
	image: text(),
	...timestamps,
	/** Platform role from the admin plugin: 'admin' or 'user'. */
	role: text(),
	banned: boolean().default(false),
	banReason: text(),
	banExpires: timestamp({ withTimezone: true })
});

export const session = pgTable(
	'session',
	{
		id: text().primaryKey(),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		token: text().notNull().unique(),
		...timestamps,
		ipAddress: text(),
		userAgent: text(),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		activeOrganizationId: text(),
		impersonatedBy: text()
	},
	(t) => [index('session_user_id_idx').on(t.userId)]
);

export const account = pgTable(
	'account',
	{
		id: text().primaryKey(),
		accountId: text().notNull(),
		providerId: text().notNull(),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		accessToken: text(),
		refreshToken: text(),
		idToken: text(),
		accessTokenExpiresAt: timestamp({ withTimezone: true }),
		refreshTokenExpiresAt: timestamp({ withTimezone: true }),
		scope: text(),
		password: text(),
		...timestamps
	},
	(t) => [index('account_user_id_idx').on(t.userId)]
);

export const verification = pgTable(
	'verification',
	{
		id: text().primaryKey(),
		identifier: text().notNull(),
		value: text().notNull(),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		...timestamps
	},
	(t) => [index('verification_identifier_idx').on(t.identifier)]
);

/** Membership of a user in an organisation with one of the roles in permissions.ts. */
export const member = pgTable(
	'member',
	{
		id: text().primaryKey(),
		organizationId: text()
			.notNull()
			.references(() => organisation.id, { onDelete: 'cascade' }),
		userId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' }),
		role: text().notNull().default('viewer'),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('member_organization_id_idx').on(t.organizationId),
		index('member_user_id_idx').on(t.userId)
	]
);

export const invitation = pgTable(
	'invitation',
	{
		id: text().primaryKey(),
		organizationId: text()
			.notNull()
			.references(() => organisation.id, { onDelete: 'cascade' }),
		email: text().notNull(),
		role: text(),
		status: text().notNull().default('pending'),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		inviterId: text()
			.notNull()
			.references(() => user.id, { onDelete: 'cascade' })
	},
	(t) => [
		index('invitation_organization_id_idx').on(t.organizationId),
		index('invitation_email_idx').on(t.email)
	]
);

/** better-auth's request counters (database storage, so several app instances share them). */
export const rateLimit = pgTable('rate_limit', {
	id: text().primaryKey(),
	key: text().notNull().unique(),
	count: integer().notNull(),
	lastRequest: bigint({ mode: 'number' }).notNull()
});

export const userRelations = relations(user, ({ many }) => ({
	sessions: many(session),
	accounts: many(account),
	members: many(member),
	invitations: many(invitation)
}));
export const sessionRelations = relations(session, ({ one }) => ({
	user: one(user, { fields: [session.userId], references: [user.id] })
}));
export const accountRelations = relations(account, ({ one }) => ({
	user: one(user, { fields: [account.userId], references: [user.id] })
}));
export const organisationRelations = relations(organisation, ({ many }) => ({
	members: many(member),
	invitations: many(invitation)
}));
export const memberRelations = relations(member, ({ one }) => ({
	organisation: one(organisation, {
		fields: [member.organizationId],
		references: [organisation.id]
	}),
	user: one(user, { fields: [member.userId], references: [user.id] })
}));
export const invitationRelations = relations(invitation, ({ one }) => ({
	organisation: one(organisation, {
		fields: [invitation.organizationId],
		references: [organisation.id]
	}),
	user: one(user, { fields: [invitation.inviterId], references: [user.id] })
}));

import { and, desc, eq, gt, isNull, lt, or, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { apiKey, user } from '../db/schema';
import { hashKey, newKeySecret } from '../api/key-secret';
import type { ApiKeyScope } from '$lib/schemas/api-key';

/** The owner's keys, newest first; never the hash. */
export async function listApiKeys(db: Db, userId: string) {
	return db
		.select({
			id: apiKey.id,
			name: apiKey.name,
			prefix: apiKey.prefix,
			scopes: apiKey.scopes,
			ratePerMinute: apiKey.ratePerMinute,
			expiresAt: apiKey.expiresAt,
			lastUsedAt: apiKey.lastUsedAt,
			revokedAt: apiKey.revokedAt,
			createdAt: apiKey.createdAt
		})
		.from(apiKey)
		.where(eq(apiKey.userId, userId))
		.orderBy(desc(apiKey.createdAt));
}

/** A new key for `userId`; the returned `key` is the only time the secret exists in clear. */
export async function createApiKey(
	db: Db,
	userId: string,
	input: { name: string; scopes: ApiKeyScope[]; expiresAt: Date | null }
): Promise<{ id: string; key: string; prefix: string }> {
	const secret = newKeySecret();
	const [row] = await db
		.insert(apiKey)
		.values({
			userId,
			name: input.name,
			prefix: secret.prefix,
			keyHash: secret.hash,
			scopes: [...new Set(input.scopes)],
			expiresAt: input.expiresAt
		})
		.returning({ id: apiKey.id });
	return { id: row.id, key: secret.key, prefix: secret.prefix };
}

/** Revoke one of the owner's keys; false when it is not theirs or already revoked. */
export async function revokeApiKey(db: Db, userId: string, id: string): Promise<boolean> {
	const rows = await db
		.update(apiKey)
		.set({ revokedAt: new Date() })
		.where(and(eq(apiKey.id, id), eq(apiKey.userId, userId), isNull(apiKey.revokedAt)))
		.returning({ id: apiKey.id });
	return rows.length > 0;
}

export interface ResolvedKey {
	id: string;
	scopes: string[];
	ratePerMinute: number;
	owner: {
		id: string;
		name: string;
		email: string;
		emailVerified: boolean;
		role: string | null;
		image: string | null;
		createdAt: Date;
		updatedAt: Date;
		banned: boolean | null;
		banReason: string | null;
		banExpires: Date | null;
	};
}

/**
 * The live key with this secret and its owner, stamping its last use; null for an unknown,
 * revoked or expired key, or one whose owner is banned. One UPDATE … RETURNING, so the check and
 * the stamp cannot drift apart.
 */
export async function resolveApiKey(db: Db, key: string, now = new Date()) {
	const [row] = await db
		.update(apiKey)
		.set({ lastUsedAt: now })
		.where(
			and(
				eq(apiKey.keyHash, hashKey(key)),
				isNull(apiKey.revokedAt),
				or(isNull(apiKey.expiresAt), gt(apiKey.expiresAt, now))
			)
		)
		.returning({
			id: apiKey.id,
			userId: apiKey.userId,
			scopes: apiKey.scopes,
			rate: apiKey.ratePerMinute
		});
	if (!row) return null;
	const [owner] = await db
		.select()
		.from(user)
		.where(
			and(
				eq(user.id, row.userId),
				// A banned account's keys stop with it (better-auth lifts expired bans itself).
				or(sql`${user.banned} IS NOT TRUE`, lt(user.banExpires, now))
			)
		);
	if (!owner) return null;
	return { id: row.id, scopes: row.scopes, ratePerMinute: row.rate, owner } satisfies ResolvedKey;
}

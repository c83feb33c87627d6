import { and, desc, eq, gt, isNull, lt, or, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { apiKey, user } from '../db/schema';
import { hashKey, newKeySecret } from '../api/key-secret';
import type { ApiKeyScope } from '$lib/schemas/api-key';
import type { Viewer } from '../access';
import { recordAudit } from './audit';

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

/**
 * A new key for the signed-in viewer; the returned `key` is the only time the secret exists in
 * clear. The audit log records the key's id, prefix and scopes, never the secret.
 */
export async function createApiKey(
	db: Db,
	viewer: Viewer,
	input: { name: string; scopes: ApiKeyScope[]; expiresAt: Date | null }
): Promise<{ id: string; key: string; prefix: string }> {
	const userId = viewer.userId;
	if (!userId) throw new Error('createApiKey needs a signed-in viewer');
	const secret = newKeySecret();
	const scopes = [...new Set(input.scopes)];
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(apiKey)
			.values({
				userId,
				name: input.name,
				prefix: secret.prefix,
				keyHash: secret.hash,
				scopes,
				expiresAt: input.expiresAt
			})
			.returning({ id: apiKey.id });
		await recordAudit(tx, viewer, {
			action: 'api_key.create',
			organisationId: null,
			datasetId: null,
			details: { keyId: row.id, prefix: secret.prefix, scopes, expiresAt: input.expiresAt }
		});
		return { id: row.id, key: secret.key, prefix: secret.prefix };
	});
}

/** Revoke one of the viewer's own keys; false when it is not theirs or already revoked. */
export async function revokeApiKey(db: Db, viewer: Viewer, id: string): Promise<boolean> {
	const userId = viewer.userId;
	if (!userId) return false;
	return db.transaction(async (tx) => {
		const rows = await tx
			.update(apiKey)
			.set({ revokedAt: new Date() })
			.where(and(eq(apiKey.id, id), eq(apiKey.userId, userId), isNull(apiKey.revokedAt)))
			.returning({ id: apiKey.id, prefix: apiKey.prefix });
		if (rows.length === 0) return false;
		await recordAudit(tx, viewer, {
			action: 'api_key.revoke',
			organisationId: null,
			datasetId: null,
			details: { keyId: id, prefix: rows[0].prefix }
		});
		return true;
	});
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

import { error, type RequestEvent } from '@sveltejs/kit';
import { sql } from 'drizzle-orm';
import type { Db } from './db/client';
import { USER_RATE_RULES, type RateRule, type UserRateRule } from './auth/rate-rules';

/**
 * Count one attempt under `key` and say whether it is over the rule's limit. One atomic upsert
 * (no read-then-write), so concurrent requests cannot all slip under the limit. It shares
 * better-auth's `rate_limit` table (better-auth's own keys have no `form|`/`user|` prefix) and
 * uses a fixed window that starts with the first attempt.
 */
export async function countAttempt(
	db: Db,
	key: string,
	{ windowS, max }: RateRule,
	now = Date.now()
): Promise<{ allowed: true } | { allowed: false; retryAfterS: number }> {
	const windowMs = windowS * 1000;
	const rows = await db.execute<{ count: number; started: string }>(sql`
		INSERT INTO rate_limit (id, key, count, last_request)
		VALUES (${crypto.randomUUID()}, ${key}, 1, ${now})
		ON CONFLICT (key) DO UPDATE SET
			count = CASE WHEN rate_limit.last_request <= ${now - windowMs} THEN 1 ELSE rate_limit.count + 1 END,
			last_request = CASE WHEN rate_limit.last_request <= ${now - windowMs} THEN ${now} ELSE rate_limit.last_request END
		RETURNING count, last_request AS started`);
	const { count, started } = rows[0];
	if (count <= max) return { allowed: true };
	return {
		allowed: false,
		retryAfterS: Math.max(1, Math.ceil((Number(started) + windowMs - now) / 1000))
	};
}

/** The key of a signed-in user's counter for a rule (exported for tests that reset it). */
export const userRateKey = (userId: string, rule: UserRateRule) => `user|${userId}|${rule}`;

/** In an API route: count one call of a signed-in user; a 429 with Retry-After when over the limit. */
export async function limitUser(db: Db, event: RequestEvent, userId: string, rule: UserRateRule) {
	const verdict = await countAttempt(db, userRateKey(userId, rule), USER_RATE_RULES[rule]);
	if (verdict.allowed) return;
	event.setHeaders({ 'retry-after': String(verdict.retryAfterS) });
	error(429, `Too many requests; try again in ${verdict.retryAfterS} s.`);
}

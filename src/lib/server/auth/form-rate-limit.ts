import { fail, type RequestEvent } from '@sveltejs/kit';
import { sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { clientAddress } from './client-address';
import { AUTH_RATE_RULES, type AuthRateRule } from './rate-rules';

/**
 * Count one attempt of a client address at an account form and say whether it is over the limit.
 * One atomic upsert (no read-then-write), so concurrent requests cannot all slip under the limit.
 * It shares better-auth's `rate_limit` table (its keys have no "form|" prefix) and uses a fixed
 * window that starts with the first attempt.
 */
export async function countFormAttempt(
	db: Db,
	address: string,
	rule: AuthRateRule,
	now = Date.now()
): Promise<{ allowed: true } | { allowed: false; retryAfterS: number }> {
	const { windowS, max } = AUTH_RATE_RULES[rule];
	const windowMs = windowS * 1000;
	const key = `form|${address}|${rule}`;
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

/** In a form action: null to go on, or the 429 answer to return. */
export async function limitAuthForm(db: Db, event: RequestEvent, rule: AuthRateRule) {
	const verdict = await countFormAttempt(db, clientAddress(event.request), rule);
	if (verdict.allowed) return null;
	event.setHeaders({ 'retry-after': String(verdict.retryAfterS) });
	const minutes = Math.ceil(verdict.retryAfterS / 60);
	return fail(429, {
		message: `Too many attempts from your network. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`
	});
}

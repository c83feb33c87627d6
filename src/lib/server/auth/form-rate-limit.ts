import { fail, type RequestEvent } from '@sveltejs/kit';
import type { Db } from '../db/client';
import { countAttempt } from '../rate-limit';
import { clientAddress } from './client-address';
import { AUTH_RATE_RULES, type AuthRateRule } from './rate-rules';

/** Count one attempt of a client address at an account form (see countAttempt). */
export function countFormAttempt(db: Db, address: string, rule: AuthRateRule, now = Date.now()) {
	return countAttempt(db, `form|${address}|${rule}`, AUTH_RATE_RULES[rule], now);
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

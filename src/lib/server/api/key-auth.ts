import type { RequestEvent } from '@sveltejs/kit';
import type { Db } from '../db/client';
import { countAttempt } from '../rate-limit';
import { resolveApiKey } from '../repositories/api-keys';
import { errorBody } from './error-body';
import { keyFromHeaders } from './key-secret';

/**
 * API keys on the machine interfaces. A key is honoured on /api/v1 and /ogc only (never on pages
 * or /api/auth, so a leaked key cannot change the account); there it replaces the session cookie.
 */
export const KEY_PATHS = ['/api/v1', '/ogc'];

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
/** POSTs that compute and store nothing: a read key may call them. */
const PURE_POSTS = ['/api/v1/compute/'];

export const keyRateKey = (keyId: string) => `apikey|${keyId}`;

export function takesKeys(pathname: string): boolean {
	return KEY_PATHS.some((base) => pathname === base || pathname.startsWith(`${base}/`));
}

function refusal(
	status: number,
	code: string,
	message: string,
	headers: Record<string, string> = {}
) {
	return new Response(JSON.stringify(errorBody(code, message)), {
		status,
		headers: { 'content-type': 'application/json', 'cache-control': 'no-store', ...headers }
	});
}

export type KeyOutcome =
	| { kind: 'none' }
	| { kind: 'refused'; response: Response }
	| { kind: 'key'; key: NonNullable<Awaited<ReturnType<typeof resolveApiKey>>> };

/**
 * Who a key-carrying request is: the key's owner, or a refusal — 401 for an unknown, revoked or
 * expired key (the same words for each, so a key's state is not disclosed), 403 for a change with a
 * read-only key, 429 with Retry-After past the key's rate.
 */
export async function authenticateKey(db: Db, event: RequestEvent): Promise<KeyOutcome> {
	if (!takesKeys(event.url.pathname)) return { kind: 'none' };
	const secret = keyFromHeaders(event.request.headers);
	if (secret === null) return { kind: 'none' };
	const key = secret ? await resolveApiKey(db, secret) : null;
	if (!key)
		return {
			kind: 'refused',
			response: refusal(401, 'invalid_api_key', 'The API key is unknown, revoked or expired.', {
				'www-authenticate': 'Bearer realm="thermalith"'
			})
		};
	const verdict = await countAttempt(db, keyRateKey(key.id), {
		windowS: 60,
		max: key.ratePerMinute
	});
	if (!verdict.allowed)
		return {
			kind: 'refused',
			response: refusal(
				429,
				'rate_limited',
				`Too many requests with this key (${key.ratePerMinute} a minute); try again in ${verdict.retryAfterS} s.`,
				{ 'retry-after': String(verdict.retryAfterS) }
			)
		};
	const path = event.url.pathname;
	const writes =
		!SAFE_METHODS.has(event.request.method) && !PURE_POSTS.some((p) => path.startsWith(p));
	if (writes && !key.scopes.includes('write'))
		return {
			kind: 'refused',
			response: refusal(
				403,
				'insufficient_scope',
				'This API key may only read; create a key with write access to make changes.'
			)
		};
	return { kind: 'key', key };
}

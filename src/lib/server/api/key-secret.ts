import { createHash, randomBytes } from 'node:crypto';

/**
 * API key secrets. Own code rather than better-auth's API-key plugin: the plugin's releases for
 * 1.7 pin older `better-call` and `@better-auth/utils` than the better-auth the app runs, and it
 * has no read/write scopes. A key is 32 random bytes, so one SHA-256 (no slow password hash) is
 * enough at rest: nobody can guess such a key from its hash, and lookup is one index probe.
 */

export const KEY_PREFIX = 'thl_';
/** Characters of the key kept in clear, so the owner can tell keys apart on the account page. */
export const SHOWN_CHARACTERS = 12;

export function newKeySecret(): { key: string; prefix: string; hash: string } {
	const key = KEY_PREFIX + randomBytes(32).toString('base64url');
	return { key, prefix: key.slice(0, SHOWN_CHARACTERS), hash: hashKey(key) };
}

export function hashKey(key: string): string {
	return createHash('sha256').update(key).digest('hex');
}

/**
 * The key a request carries: `Authorization: Bearer <key>` or `X-API-Key: <key>`. Returns null
 * when neither is present, and the text (possibly malformed) otherwise.
 */
export function keyFromHeaders(headers: Headers): string | null {
	const direct = headers.get('x-api-key');
	if (direct !== null) return direct.trim();
	const authorization = headers.get('authorization');
	if (authorization === null) return null;
	const m = /^Bearer\s+(.+)$/i.exec(authorization.trim());
	return m ? m[1].trim() : authorization.trim();
}

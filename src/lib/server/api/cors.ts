/**
 * CORS of /api/v1: a script on a page of another origin may call the API with its key header
 * (`Authorization: Bearer` or `X-API-Key`) and a JSON body, so the browser's preflight is answered
 * here. Never with credentials: `Access-Control-Allow-Origin: *` and no
 * `Access-Control-Allow-Credentials`, so browsers neither send this site's cookies on such calls
 * nor let another site read an answer made with them (the session stays for our own pages; the
 * Origin check, origin-check.ts, refuses cookie-carrying changes from elsewhere). /ogc answers its
 * own, read-only preflight (ogc/http.ts).
 */

export const API_BASE = '/api/v1';

export const API_CORS_HEADERS: Record<string, string> = {
	'access-control-allow-origin': '*',
	'access-control-expose-headers': 'ETag, Location, Retry-After, Content-Disposition'
};

const ALLOWED_METHODS = 'GET, HEAD, POST, PUT, DELETE, OPTIONS';
const ALLOWED_HEADERS = 'Authorization, X-API-Key, Content-Type, Accept, If-None-Match';

export function isApiPath(pathname: string): boolean {
	return pathname === API_BASE || pathname.startsWith(`${API_BASE}/`);
}

/** The answer to a preflight (OPTIONS) of any /api/v1 address. */
export function apiPreflight(): Response {
	return new Response(null, {
		status: 204,
		headers: {
			...API_CORS_HEADERS,
			'access-control-allow-methods': ALLOWED_METHODS,
			'access-control-allow-headers': ALLOWED_HEADERS,
			'access-control-max-age': '86400',
			allow: ALLOWED_METHODS
		}
	});
}

/** Every /api/v1 answer may be read from any origin (without credentials, see above). */
export function withApiCors(response: Response): Response {
	let target = response;
	try {
		for (const [name, value] of Object.entries(API_CORS_HEADERS)) target.headers.set(name, value);
	} catch {
		// Immutable headers (a fetched response passed through): copy it once.
		target = new Response(response.body, response);
		for (const [name, value] of Object.entries(API_CORS_HEADERS)) target.headers.set(name, value);
	}
	return target;
}

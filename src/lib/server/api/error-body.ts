/**
 * The one error body of the machine interfaces (/api/v1 and /ogc):
 * `{ "error": { "code", "message", "details" } }`. `code` is a stable word a script can branch
 * on; `message` is for people; `details` names what was wrong (a parameter, a field).
 */
export interface ApiErrorBody {
	error: { code: string; message: string; details: Record<string, unknown> };
}

export function errorBody(
	code: string,
	message: string,
	details: Record<string, unknown> = {}
): ApiErrorBody {
	return { error: { code, message, details } };
}

/** Codes by status, for errors raised with SvelteKit's `error()` inside /api/v1 routes. */
export const CODE_BY_STATUS: Record<number, string> = {
	400: 'invalid_request',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	405: 'method_not_allowed',
	409: 'conflict',
	413: 'payload_too_large',
	415: 'unsupported_media_type',
	422: 'unprocessable',
	429: 'rate_limited',
	500: 'internal_error',
	503: 'service_unavailable'
};

/** Addresses that answer with the one error body (others keep `{ message }` or a page). */
export function answersErrorBody(pathname: string): boolean {
	return ['/api/v1', '/ogc'].some((base) => pathname === base || pathname.startsWith(`${base}/`));
}

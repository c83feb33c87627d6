import { answersErrorBody, errorBody } from './api/error-body';

/**
 * While PostgreSQL is unreachable (stopped, restarting, network gone) every request that needs it
 * fails. Those answers are 503 with Retry-After and a plain message, not a 500 "something went
 * wrong": the fault is temporary and not the request's, and load balancers and clients treat a
 * 503 as "try again later". The app keeps serving and recovers on its own once the database is
 * back (the driver reconnects per query).
 */

/** Codes of the driver (postgres.js) and the server that mean "no database now". */
const DATABASE_CODES = new Set([
	'CONNECTION_CLOSED',
	'CONNECTION_DESTROYED',
	'CONNECTION_ENDED',
	'CONNECT_TIMEOUT',
	'57P01', // admin_shutdown
	'57P02', // crash_shutdown
	'57P03' // cannot_connect_now (starting up, shutting down, in recovery)
]);

/** Network codes: they mean "no database" only under a failed query (other services have their own). */
const NETWORK_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH',
	'ENOTFOUND'
]);

export const DATABASE_DOWN_MESSAGE =
	'The database is not reachable right now. Nothing was changed; please try again in a minute.';

/**
 * True when the error, or one it wraps (Drizzle wraps driver errors in one that names the query,
 * better-auth wraps those again), is one of the driver's or the server's codes, or a network
 * failure under a database query.
 */
export function isDatabaseUnavailable(err: unknown, underQuery = false): boolean {
	let current: unknown = err;
	for (let depth = 0; depth < 6 && current && typeof current === 'object'; depth++) {
		const { code, query, errors } = current as {
			code?: unknown;
			query?: unknown;
			errors?: unknown;
		};
		underQuery ||= typeof query === 'string';
		if (typeof code === 'string') {
			if (DATABASE_CODES.has(code)) return true;
			if (underQuery && NETWORK_CODES.has(code)) return true;
		}
		// Node's AggregateError for a host that resolves to several addresses, all refusing.
		if (Array.isArray(errors) && errors.some((e) => isDatabaseUnavailable(e, underQuery)))
			return true;
		current = (current as { cause?: unknown }).cause;
	}
	return false;
}

export const RETRY_AFTER_SECONDS = '30';

/** The answer for a request that failed before any page or handler could answer. */
export function databaseDownResponse(pathname: string): Response {
	const headers = { 'retry-after': RETRY_AFTER_SECONDS, 'cache-control': 'no-store' };
	// The machine interfaces answer with their one error body (api/error-body.ts).
	if (answersErrorBody(pathname))
		return Response.json(errorBody('database_unavailable', DATABASE_DOWN_MESSAGE), {
			status: 503,
			headers
		});
	return pathname.startsWith('/api/')
		? Response.json({ message: DATABASE_DOWN_MESSAGE }, { status: 503, headers })
		: new Response(DATABASE_DOWN_MESSAGE, {
				status: 503,
				headers: { ...headers, 'content-type': 'text/plain; charset=utf-8' }
			});
}

/** A rendered error page or JSON error (status 500) for a database fault becomes a 503. */
export function asUnavailable(response: Response): Response {
	const headers = new Headers(response.headers);
	headers.set('retry-after', RETRY_AFTER_SECONDS);
	headers.set('cache-control', 'no-store');
	return new Response(response.body, { status: 503, headers });
}

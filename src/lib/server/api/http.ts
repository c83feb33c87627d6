import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { InputError } from '$lib/thermal';
import { isUuid } from '$lib/uuid';
import { contentResponse, errorResponse, etagOf, GEOJSON_TYPE, JSON_TYPE } from '../ogc/http';
import { USER_RATE_RULES, type UserRateRule } from '../auth/rate-rules';
import { clientAddress } from '../auth/client-address';
import type { Db } from '../db/client';
import { countAttempt, userRateKey } from '../rate-limit';
import {
	DATABASE_DOWN_MESSAGE,
	isDatabaseUnavailable,
	RETRY_AFTER_SECONDS
} from '../database-down';
import { CODE_BY_STATUS } from './error-body';

/*
 * HTTP side of /api/v1, shared with /ogc where the rules are the same: the one error body, weak
 * ETags with If-None-Match → 304, CORS for reading (never with credentials; see ogc/http.ts).
 */

/** An expected refusal, thrown inside a handler and answered with the one error body. */
export class ApiFailure extends Error {
	constructor(
		readonly status: number,
		readonly code: string,
		message: string,
		readonly details: Record<string, unknown> = {}
	) {
		super(message);
	}
}

/** Wrap a route handler: every refusal (ours, SvelteKit's `error()`, bad science input) is answered alike. */
export function apiHandler<E extends RequestEvent>(handle: (event: E) => Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			return await handle(event);
		} catch (err) {
			if (err instanceof ApiFailure) {
				const response = errorResponse({
					status: err.status,
					code: err.code,
					message: err.message,
					details: err.details
				});
				if (typeof err.details.retryAfterS === 'number')
					response.headers.set('retry-after', String(err.details.retryAfterS));
				return response;
			}
			if (isHttpError(err))
				return errorResponse({
					status: err.status,
					code: CODE_BY_STATUS[err.status] ?? 'error',
					message: err.body.message
				});
			if (err instanceof InputError)
				return errorResponse({
					status: 422,
					code: 'invalid_input',
					message: err.message,
					details: { field: err.field }
				});
			if (isDatabaseUnavailable(err)) {
				// Temporary and not the caller's fault: 503 with Retry-After (database-down.ts).
				console.error(`database unreachable: ${event.request.method} ${event.url.pathname}`);
				const response = errorResponse({
					status: 503,
					code: 'database_unavailable',
					message: DATABASE_DOWN_MESSAGE
				});
				response.headers.set('retry-after', RETRY_AFTER_SECONDS);
				return response;
			}
			throw err;
		}
	};
}

/** zod issues as `details`: where and what, for each. */
function issueDetails(error: z.ZodError) {
	return {
		issues: error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }))
	};
}

/** Query parameters through a strict zod schema: an unknown or repeated parameter is a 400. */
export function parseQuery<S extends z.ZodType>(schema: S, url: URL): z.output<S> {
	const raw: Record<string, string> = {};
	for (const [name, value] of url.searchParams) {
		if (name in raw)
			throw new ApiFailure(400, 'invalid_parameter', `${name} is given more than once`, {
				parameter: name
			});
		raw[name] = value;
	}
	const parsed = schema.safeParse(raw);
	if (!parsed.success) {
		const first = parsed.error.issues[0];
		const name = first.path.length
			? String(first.path[0])
			: String((first as { keys?: string[] }).keys?.[0] ?? '');
		throw new ApiFailure(400, 'invalid_parameter', `${name}: ${first.message}`, {
			parameter: name,
			...issueDetails(parsed.error)
		});
	}
	return parsed.data;
}

/** Most bytes of a JSON request body (a long log of 100,000 points fits). */
export const MAX_JSON_BYTES = 5_000_000;

/** A JSON request body through a zod schema; unreadable JSON and invalid fields are 400s. */
export async function parseJsonBody<S extends z.ZodType>(
	schema: S,
	request: Request
): Promise<z.output<S>> {
	const type = request.headers.get('content-type') ?? '';
	if (!/^application\/json\b/i.test(type))
		throw new ApiFailure(415, 'unsupported_media_type', 'Send the body as application/json.');
	const text = await request.text();
	if (text.length > MAX_JSON_BYTES)
		throw new ApiFailure(413, 'payload_too_large', `The body is over ${MAX_JSON_BYTES} bytes.`);
	let json: unknown;
	try {
		json = JSON.parse(text);
	} catch {
		throw new ApiFailure(400, 'invalid_json', 'The body is not valid JSON.');
	}
	const parsed = schema.safeParse(json);
	if (!parsed.success) {
		const first = parsed.error.issues[0];
		const path = first.path.map(String).join('.');
		throw new ApiFailure(
			400,
			'invalid_request',
			`${path ? `${path}: ` : ''}${first.message}`,
			issueDetails(parsed.error)
		);
	}
	return parsed.data;
}

/** A GET answer as JSON (or GeoJSON) with a weak ETag; 304 when the client holds the same. */
export function jsonAnswer(request: Request, body: unknown, geojson = false): Response {
	const text = JSON.stringify(body);
	const response = contentResponse(request, text, geojson ? GEOJSON_TYPE : JSON_TYPE, etagOf(text));
	// Keys and sessions see different data: a cache must tell them apart.
	response.headers.set('vary', 'Accept, Cookie, Authorization, X-API-Key');
	return response;
}

/** The computations' answer: no ETag (a POST), JSON. */
export function computedAnswer(body: unknown): Response {
	return new Response(JSON.stringify(body), {
		headers: { 'content-type': JSON_TYPE, 'cache-control': 'no-store' }
	});
}

/** Opaque page cursors: the last row's sort value and id, base64url JSON. */
export function encodeCursor(key: [string, string] | null): string | null {
	return key === null ? null : Buffer.from(JSON.stringify(key)).toString('base64url');
}

export function decodeCursor(text: string | undefined): [string, string] | null {
	if (text === undefined) return null;
	try {
		const value: unknown = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
		if (
			Array.isArray(value) &&
			value.length === 2 &&
			value.every((v) => typeof v === 'string' && v.length <= 200 && !v.includes('\u0000'))
		)
			return value as [string, string];
	} catch {
		// falls through to the refusal
	}
	throw new ApiFailure(
		400,
		'invalid_parameter',
		'cursor is not one this API gave out; start again without it',
		{
			parameter: 'cursor'
		}
	);
}

/** A decoded cursor whose id must be a UUID (sites, datasets). */
export function uuidCursor(text: string | undefined): [string, string] | null {
	const key = decodeCursor(text);
	if (key !== null && !isUuid(key[1]))
		throw new ApiFailure(
			400,
			'invalid_parameter',
			'cursor is not one this API gave out; start again without it',
			{
				parameter: 'cursor'
			}
		);
	return key;
}

/**
 * Count one call of a costly route for whoever asks (API key, account or client address) under
 * a USER_RATE_RULES rule; over it, a 429 with Retry-After in the one error body.
 */
export async function limitCaller(db: Db, event: RequestEvent, rule: UserRateRule) {
	const who = event.locals.apiKey
		? `key:${event.locals.apiKey.id}`
		: (event.locals.user?.id ?? `address:${clientAddress(event.request)}`);
	const verdict = await countAttempt(db, userRateKey(who, rule), USER_RATE_RULES[rule]);
	if (verdict.allowed) return;
	throw new ApiFailure(
		429,
		'rate_limited',
		`Too many requests; try again in ${verdict.retryAfterS} s.`,
		{
			retryAfterS: verdict.retryAfterS
		}
	);
}

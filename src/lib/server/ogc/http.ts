import { createHash } from 'node:crypto';
import { NOT_FOUND_MESSAGE } from '../access';
import { errorBody } from '../api/error-body';

/**
 * HTTP side of /ogc: media types, content negotiation, the one JSON error body, ETags and CORS.
 * GIS clients (GDAL, QGIS, browser map libraries) read public data across origins, so every
 * answer, errors included, allows any origin to READ it, never with credentials: a page of
 * another site cannot read what a signed-in visitor sees (browsers refuse a credentialed answer
 * to `Access-Control-Allow-Origin: *`).
 */

export const JSON_TYPE = 'application/json';
export const GEOJSON_TYPE = 'application/geo+json';
export const HTML_TYPE = 'text/html';

export type Format = 'json' | 'html';

export const CORS_HEADERS: Record<string, string> = {
	'access-control-allow-origin': '*',
	'access-control-expose-headers': 'ETag'
};

/** The answer to a CORS preflight: read-only methods, and the headers a reading client sends. */
export function preflight(): Response {
	return new Response(null, {
		status: 204,
		headers: {
			...CORS_HEADERS,
			'access-control-allow-methods': 'GET, HEAD, OPTIONS',
			'access-control-allow-headers':
				'Accept, Accept-Language, If-None-Match, Authorization, X-API-Key',
			'access-control-max-age': '86400',
			allow: 'GET, HEAD, OPTIONS'
		}
	});
}

export interface OgcError {
	status: number;
	code: string;
	message: string;
	details?: Record<string, unknown>;
}

/** The one error body: `{ "error": { "code", "message", "details" } }`. */
export function errorResponse(e: OgcError): Response {
	return new Response(JSON.stringify(errorBody(e.code, e.message, e.details)), {
		status: e.status,
		headers: { ...CORS_HEADERS, 'content-type': JSON_TYPE, 'cache-control': 'no-store' }
	});
}

/** Unknown, hidden and malformed ids: the same status and words as the rest of the app. */
export const NOT_FOUND: OgcError = { status: 404, code: 'not_found', message: NOT_FOUND_MESSAGE };

export function invalidParameter(parameter: string, message: string): OgcError {
	return { status: 400, code: 'invalid_parameter', message, details: { parameter } };
}

/** Quality of a media type in an Accept header: the most specific range that matches wins. */
function quality(accept: string, type: string): number {
	const [major] = type.split('/');
	let best = { specificity: -1, q: 0 };
	for (const part of accept.split(',')) {
		const [range, ...params] = part.trim().toLowerCase().split(';');
		const specificity = range === type ? 2 : range === `${major}/*` ? 1 : range === '*/*' ? 0 : -1;
		if (specificity <= best.specificity) continue;
		const qParam = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
		const q = qParam ? Number(qParam.slice(2)) : 1;
		best = { specificity, q: Number.isFinite(q) ? q : 0 };
	}
	return best.q;
}

/**
 * JSON or HTML: `f=json|html` decides; otherwise HTML only when the Accept header prefers
 * text/html over JSON (a browser), so GIS clients, scripts and `*\/*` get JSON. Two outcomes
 * only, so a short rule here rather than a general negotiation package.
 */
export function chooseFormat(url: URL, accept: string | null): Format | OgcError {
	const f = url.searchParams.get('f');
	if (f !== null) {
		if (f === 'json' || f === 'html') return f;
		return invalidParameter('f', `f must be json or html; got "${f}"`);
	}
	if (!accept) return 'json';
	const html = quality(accept, HTML_TYPE);
	const json = Math.max(quality(accept, JSON_TYPE), quality(accept, GEOJSON_TYPE));
	return html > json ? 'html' : 'json';
}

/**
 * A weak validator of the content. `timeStamp` (when the answer was generated) is left out, so
 * an unchanged page revalidates with 304; two viewers who see different data get different tags.
 */
export function etagOf(text: string): string {
	return `W/"${createHash('sha256').update(text).digest('base64url').slice(0, 32)}"`;
}

/** If-None-Match with weak comparison (RFC 9110 section 13.1.2): any listed tag, or `*`. */
export function notModified(ifNoneMatch: string | null, etag: string): boolean {
	if (!ifNoneMatch) return false;
	const strip = (t: string) => t.trim().replace(/^W\//, '');
	return ifNoneMatch.split(',').some((t) => t.trim() === '*' || strip(t) === strip(etag));
}

/** A 200 (or 304 when the client holds the same content) with the /ogc caching headers. */
export function contentResponse(
	request: Request,
	body: string,
	type: string,
	etag: string
): Response {
	const headers: Record<string, string> = {
		...CORS_HEADERS,
		etag,
		// Visibility depends on who asks: revalidate every time, never share one viewer's answer.
		'cache-control': 'private, no-cache',
		vary: 'Accept, Cookie, Authorization, X-API-Key'
	};
	if (notModified(request.headers.get('if-none-match'), etag))
		return new Response(null, { status: 304, headers });
	return new Response(body, { status: 200, headers: { ...headers, 'content-type': type } });
}

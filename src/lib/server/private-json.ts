import { createHash } from 'node:crypto';

/**
 * A JSON answer that depends on who asks (map data, counts, statistics): cacheable by the
 * viewer's own browser only (`private`, Vary: Cookie), never by a shared cache, with an ETag of
 * the body so a repeated view costs a 304 instead of the bytes.
 */
export function privateJson(request: Request, body: unknown, maxAgeS = 30): Response {
	const text = JSON.stringify(body);
	const etag = `"${createHash('sha1').update(text).digest('base64url')}"`;
	const headers = {
		'content-type': 'application/json',
		'cache-control': `private, max-age=${maxAgeS}`,
		vary: 'cookie',
		etag
	};
	const asked = request.headers.get('if-none-match');
	if (asked && asked.split(',').some((t) => t.trim() === etag)) {
		return new Response(null, { status: 304, headers });
	}
	return new Response(text, { headers });
}

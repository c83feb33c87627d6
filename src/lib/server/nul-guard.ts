/**
 * PostgreSQL text cannot hold a NUL character: a `%00` in a path segment or query value that
 * reaches a query fails it with a 500. No address of the site has a use for one, so a request
 * whose address contains one is answered 400 before any route runs.
 * Returns the 400 to send, or null to go on.
 */
export function nulRefusal(url: URL): Response | null {
	if (!/%00/.test(url.pathname + url.search)) return null;
	return new Response('Bad request: the address contains a NUL character (%00).', {
		status: 400,
		headers: { 'content-type': 'text/plain; charset=utf-8' }
	});
}

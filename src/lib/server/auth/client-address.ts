import type { RequestEvent } from '@sveltejs/kit';

/**
 * The header better-auth reads the client's address from. The app sets it on every request from
 * the connection itself (`getClientAddress()`, which honours adapter-node's ADDRESS_HEADER and
 * XFF_DEPTH only when a proxy is configured), replacing anything the client sent. better-auth's
 * default, X-Forwarded-For, is whatever the client says it is: a new value per request escaped
 * every per-address limit.
 */
export const CLIENT_ADDRESS_HEADER = 'x-thermalith-client-address';

export function stampClientAddress(event: RequestEvent) {
	event.request.headers.set(CLIENT_ADDRESS_HEADER, event.getClientAddress());
}

/** The address stamped on a request (also read by the app's own limits). */
export function clientAddress(request: Request): string {
	return request.headers.get(CLIENT_ADDRESS_HEADER) ?? 'unknown';
}

/**
 * Response headers that make every answer (pages, API JSON, redirects to downloads) harder to
 * abuse: no framing, no MIME sniffing, a referrer that never carries paths off the site, no
 * powerful browser features, HSTS on https, and no caching of anything a signed-in person sees.
 * Page CSPs come from SvelteKit (kit.csp in svelte.config.js, with per-response nonces); this file
 * only widens them with sources known at run time (csp-sources.ts: an optional tile
 * server) and gives every other response a CSP that allows nothing.
 */

export interface SecurityContext {
	/** The site is served over https (ORIGIN starts with https://): send HSTS. */
	https: boolean;
	/**
	 * Sources known only at run time, added to the page CSP: the object store the browser talks to
	 * directly (presigned upload PUTs, thumbnail and download redirects) and an optional tile server.
	 */
	extraSources: { 'connect-src': string[]; 'img-src': string[] };
	/** The response may show unpublished data (someone is signed in, or it sets cookies). */
	private: boolean;
}

/** For responses that are not SvelteKit pages: JSON, files, redirects. Nothing may run or load. */
export const API_CSP =
	"default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

export const PERMISSIONS_POLICY =
	'camera=(), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), midi=(), browsing-topics=()';

/** Add sources to some directives of a CSP header value (directives absent stay absent). */
export function addCspSources(csp: string, sources: Record<string, string[]>): string {
	return csp
		.split(';')
		.map((part) => part.trim())
		.filter(Boolean)
		.map((part) => {
			const [name] = part.split(/\s+/, 1);
			const extra = sources[name.toLowerCase()];
			return extra?.length ? `${part} ${extra.join(' ')}` : part;
		})
		.join('; ');
}

/**
 * The CSP source for a URL or a Leaflet tile template (`https://{s}.tiles.example/{z}/{x}/{y}.png`
 * → `https://*.tiles.example`); null for anything else than http(s).
 */
export function cspSource(url: string | null | undefined): string | null {
	const m = /^(https?):\/\/([^/?#]+)/i.exec(url ?? '');
	if (!m) return null;
	const [, scheme, hostPort] = m;
	const wildcard = hostPort.replace(/^\{[^}]*\}\./, '*.');
	// A placeholder elsewhere in the host cannot be expressed as a CSP host: allow the scheme.
	if (/[{}\s;,']/.test(wildcard)) return `${scheme.toLowerCase()}:`;
	return `${scheme.toLowerCase()}://${wildcard.toLowerCase()}`;
}

/** Set the headers on a copy of the response when its headers are immutable (Response.redirect, fetch). */
function mutable(response: Response): Response {
	try {
		response.headers.set('x-content-type-options', 'nosniff');
		return response;
	} catch {
		return new Response(response.body, {
			status: response.status,
			statusText: response.statusText,
			headers: new Headers(response.headers)
		});
	}
}

export function withSecurityHeaders(original: Response, ctx: SecurityContext): Response {
	const response = mutable(original);
	const h = response.headers;
	const csp = h.get('content-security-policy');
	if (csp) {
		let widened = addCspSources(csp, ctx.extraSources);
		if (ctx.https) widened += '; upgrade-insecure-requests';
		h.set('content-security-policy', widened);
	} else {
		h.set('content-security-policy', API_CSP);
	}
	h.set('x-content-type-options', 'nosniff');
	h.set('x-frame-options', 'DENY');
	h.set('referrer-policy', 'strict-origin-when-cross-origin');
	h.set('permissions-policy', PERMISSIONS_POLICY);
	h.set('cross-origin-opener-policy', 'same-origin');
	if (ctx.https) h.set('strict-transport-security', 'max-age=31536000; includeSubDomains');
	if (ctx.private || h.has('set-cookie')) h.set('cache-control', 'private, no-store');
	return response;
}

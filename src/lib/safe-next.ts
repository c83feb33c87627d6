/**
 * The one rule for following a `next=` address after signing in (server redirects and any page
 * that navigates): only a path on this site, never another origin (open-redirect guard).
 * Browsers drop tabs and newlines inside URLs and read `\` as `/`, so `/\t/evil.example` and
 * `/\evil.example` would become `//evil.example`; any such character, raw or percent-encoded,
 * makes the whole address unsafe rather than being cleaned up.
 */

// eslint-disable-next-line no-control-regex -- matching control characters is the point
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\\]/;
const BASE = 'http://next.invalid';

function decoded(value: string): string | null {
	try {
		return decodeURIComponent(value);
	} catch {
		return null;
	}
}

export function safeNext(next: string | null | undefined, fallback = '/account'): string {
	if (!next || next.length > 2000) return fallback;
	const plain = decoded(next);
	if (plain === null) return fallback;
	for (const form of [next, plain]) {
		if (!form.startsWith('/') || form.startsWith('//') || UNSAFE.test(form)) return fallback;
	}
	// Last word to the URL parser itself: the address must stay on this origin.
	if (new URL(next, BASE).origin !== BASE) return fallback;
	return next;
}

/**
 * The one rule for web addresses that users enter and other users click (an organisation's
 * website): http or https only, so `javascript:`, `data:` and friends can never become a link.
 * Shared by the zod schema (form and better-auth hooks) and by every page that renders such a link.
 */

// Whitespace and control characters inside an address: browsers strip some of them while parsing
// (`java\tscript:`), so an address that contains any is refused rather than guessed at.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const UNSAFE_CHARACTERS = /[\s\u0000-\u001f\u007f-\u009f]/;

/** The trimmed address if it is a plain http(s) URL with a dotted host and no credentials; else null. */
export function safeHttpUrl(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const trimmed = value.trim();
	if (trimmed === '' || trimmed.length > 2000 || UNSAFE_CHARACTERS.test(trimmed)) return null;
	if (!/^https?:\/\//i.test(trimmed)) return null;
	let url: URL;
	try {
		url = new URL(trimmed);
	} catch {
		return null;
	}
	if (url.protocol !== 'http:' && url.protocol !== 'https:') return null;
	// `https://trusted.example@evil.example/` reads as one site and opens another.
	if (url.username || url.password) return null;
	if (!url.hostname.includes('.')) return null;
	return trimmed;
}

/**
 * Session cookies: never readable by scripts (HttpOnly), not sent on cross-site subrequests
 * (SameSite=Lax), and Secure (with better-auth's `__Secure-` prefix) whenever the site's origin is
 * https, whatever the profile: a https deployment in any mode must not leak the session over http.
 */
export function cookieSettings(baseURL: string) {
	return {
		useSecureCookies: baseURL.startsWith('https://'),
		defaultCookieAttributes: { httpOnly: true, sameSite: 'lax' as const }
	};
}

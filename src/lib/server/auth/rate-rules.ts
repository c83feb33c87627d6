/**
 * How often one client address may call the account endpoints, in one table for both entry
 * points: better-auth's HTTP routes (/api/auth/…, its own limiter) and the product's form actions
 * (which call auth.api directly, where better-auth's limiter does not run).
 */
export const AUTH_RATE_RULES = {
	'/sign-in/email': { windowS: 60, max: 20 },
	'/sign-up/email': { windowS: 60, max: 10 },
	'/request-password-reset': { windowS: 300, max: 5 },
	'/reset-password': { windowS: 300, max: 10 },
	'/send-verification-email': { windowS: 300, max: 5 }
} as const;

export type AuthRateRule = keyof typeof AUTH_RATE_RULES;

/** better-auth's `rateLimit.customRules` shape. */
export const betterAuthRateRules = Object.fromEntries(
	Object.entries(AUTH_RATE_RULES).map(([path, r]) => [path, { window: r.windowS, max: r.max }])
);

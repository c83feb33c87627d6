/** A fixed window of `windowS` seconds in which `max` attempts are allowed. */
export type RateRule = { windowS: number; max: number };

/**
 * The one place for the product's request limits.
 *
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

/**
 * How often one signed-in user may call costly routes (counted by src/lib/server/rate-limit.ts).
 * An import preview validates a whole upload (up to the body limit) without writing anything;
 * the wizard calls it once per file and mapping change.
 */
export const USER_RATE_RULES = {
	'import-preview': { windowS: 60, max: 30 },
	// A new heat-flow grid costs a worker seconds of CPU; counted per user, or per client address
	// for anonymous callers, and only when a new job is queued (a cached grid costs nothing).
	'grid-job': { windowS: 600, max: 30 },
	// A Monte Carlo geotherm of up to 5,000 samples costs a core up to a second; per caller (API
	// key, account or, signed out, client address), on top of a key's own rate.
	computation: { windowS: 60, max: 60 }
} as const satisfies Record<string, RateRule>;

export type UserRateRule = keyof typeof USER_RATE_RULES;

/** better-auth's `rateLimit.customRules` shape. */
export const betterAuthRateRules = Object.fromEntries(
	Object.entries(AUTH_RATE_RULES).map(([path, r]) => [path, { window: r.windowS, max: r.max }])
);

import { APIError, createAuthMiddleware } from 'better-auth/api';
import { and, count, eq, gt, inArray, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { signInFailure } from '../db/schema';

/** Five failed passwords for one address within 15 minutes lock that address for the rest of the window. */
export const MAX_FAILED_SIGN_INS = 5;
export const FAILED_SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

/** Take back one attempt row of an address (its own, or an equal one: only the count matters). */
async function withdrawAttempt(db: Db, email: string) {
	const newest = db
		.select({ id: signInFailure.id })
		.from(signInFailure)
		.where(eq(signInFailure.email, email))
		.orderBy(sql`${signInFailure.at} DESC`)
		.limit(1);
	await db.delete(signInFailure).where(inArray(signInFailure.id, newest));
}

/**
 * better-auth's own rate limit counts HTTP requests per IP; it neither sees server-side calls from
 * form actions nor tells a typo from a guessing attack. This guard counts failed passwords per
 * e-mail address, whatever the route, and refuses further attempts with 429.
 *
 * Every attempt is written as a failure *before* the password is checked and withdrawn afterwards
 * unless the password was wrong. Reading the count first and writing it after let 20 concurrent
 * guesses all pass a limit of 5; this way the attempt that makes the sixth row sees six rows.
 */
export function signInGuard(db: Db) {
	return {
		before: createAuthMiddleware(async (ctx) => {
			if (ctx.path !== '/sign-in/email') return;
			const email = String(ctx.body?.email ?? '').toLowerCase();
			await db.insert(signInFailure).values({ email });
			const since = new Date(Date.now() - FAILED_SIGN_IN_WINDOW_MS);
			const [{ n }] = await db
				.select({ n: count() })
				.from(signInFailure)
				.where(and(eq(signInFailure.email, email), gt(signInFailure.at, since)));
			if (n > MAX_FAILED_SIGN_INS) {
				await withdrawAttempt(db, email);
				throw new APIError('TOO_MANY_REQUESTS', {
					message:
						'Too many failed sign-ins for this address. Wait 15 minutes or reset your password.'
				});
			}
		}),
		after: createAuthMiddleware(async (ctx) => {
			if (ctx.path !== '/sign-in/email') return;
			const returned = ctx.context.returned;
			const wrongPassword = returned instanceof APIError && returned.status === 'UNAUTHORIZED';
			if (!wrongPassword) await withdrawAttempt(db, String(ctx.body?.email ?? '').toLowerCase());
		})
	};
}

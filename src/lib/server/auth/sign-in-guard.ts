import { APIError, createAuthMiddleware } from 'better-auth/api';
import { and, count, eq, gt, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { signInFailure } from '../db/schema';

/** Five failed passwords for one address within 15 minutes lock that address for the rest of the window. */
export const MAX_FAILED_SIGN_INS = 5;
export const FAILED_SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

/**
 * Take back one attempt row of an address (its own, or an equal one: only the count matters).
 * SKIP LOCKED: two concurrent withdrawals pick two different rows, never the same one twice.
 */
async function withdrawAttempt(db: Db, email: string) {
	await db.execute(sql`
		DELETE FROM ${signInFailure} WHERE ${signInFailure.id} = (
			SELECT ${signInFailure.id} FROM ${signInFailure} WHERE ${signInFailure.email} = ${email}
			ORDER BY ${signInFailure.at} DESC LIMIT 1 FOR UPDATE SKIP LOCKED
		)`);
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
			const [own] = await db
				.insert(signInFailure)
				.values({ email })
				.returning({ id: signInFailure.id });
			const since = new Date(Date.now() - FAILED_SIGN_IN_WINDOW_MS);
			const [{ n }] = await db
				.select({ n: count() })
				.from(signInFailure)
				.where(and(eq(signInFailure.email, email), gt(signInFailure.at, since)));
			if (n > MAX_FAILED_SIGN_INS) {
				await db.delete(signInFailure).where(eq(signInFailure.id, own.id));
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

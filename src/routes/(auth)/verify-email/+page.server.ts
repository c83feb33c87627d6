import { fail, redirect } from '@sveltejs/kit';
import { APIError } from 'better-auth/api';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { parseForm } from '$lib/schemas/form';
import { emailOnlySchema } from '$lib/schemas/account';
import { safeNext } from '$lib/safe-next';
import type { Actions, PageServerLoad } from './$types';

const DONE = ['verified', 'approved'] as const;

export const load: PageServerLoad = async ({ url, request, locals }) => {
	const next = safeNext(url.searchParams.get('next'), '');
	const done = url.searchParams.get('done');
	if (done && (DONE as readonly string[]).includes(done)) {
		return { state: done as (typeof DONE)[number], email: '', next };
	}
	const token = url.searchParams.get('token');
	if (!token) {
		return {
			state: 'sent' as const,
			email: url.searchParams.get('sent') ?? locals.user?.email ?? '',
			next
		};
	}
	let state: (typeof DONE)[number];
	try {
		await auth().api.verifyEmail({ query: { token }, headers: request.headers });
		// The same link type serves a change of address; its first step only approves the move.
		state = tokenPurpose(token) === 'change-email-confirmation' ? 'approved' : 'verified';
	} catch (err) {
		if (err instanceof APIError)
			return { state: 'invalid' as const, email: locals.user?.email ?? '', next };
		throw err;
	}
	// A fresh request, so the page (and its header) reads the account as it is now: confirmed and
	// signed in, without the "confirm your address" banner of the request that confirmed it.
	redirect(303, `/verify-email?${new URLSearchParams({ done: state, ...(next ? { next } : {}) })}`);
};

export const actions: Actions = {
	resend: async (event) => {
		const { request, url } = event;
		const limited = await limitAuthForm(getDb(), event, '/send-verification-email');
		if (limited) return limited;
		const parsed = parseForm(emailOnlySchema, await request.formData());
		if (!parsed.ok) return fail(400, parsed);
		const next = safeNext(url.searchParams.get('next'), '');
		try {
			await auth().api.sendVerificationEmail({
				body: { email: parsed.data.email, ...(next ? { callbackURL: next } : {}) },
				headers: request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		return { resent: true };
	}
};

/** The purpose better-auth wrote into the (already verified) token's payload, if any. */
function tokenPurpose(token: string): string | null {
	try {
		const payload = JSON.parse(
			Buffer.from(token.split('.')[1] ?? '', 'base64url').toString('utf8')
		);
		return typeof payload.requestType === 'string' ? payload.requestType : null;
	} catch {
		return null;
	}
}

import { fail } from '@sveltejs/kit';
import { APIError } from 'better-auth/api';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { getDb } from '$lib/server/db';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { parseForm } from '$lib/schemas/form';
import { emailOnlySchema } from '$lib/schemas/account';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url, request, locals }) => {
	const token = url.searchParams.get('token');
	if (!token) {
		return {
			state: 'sent' as const,
			email: url.searchParams.get('sent') ?? locals.user?.email ?? ''
		};
	}
	try {
		await auth().api.verifyEmail({ query: { token }, headers: request.headers });
		// The same link type serves a change of address; its first step only approves the move.
		return {
			state:
				tokenPurpose(token) === 'change-email-confirmation'
					? ('approved' as const)
					: ('verified' as const),
			email: ''
		};
	} catch (err) {
		if (err instanceof APIError)
			return { state: 'invalid' as const, email: locals.user?.email ?? '' };
		throw err;
	}
};

export const actions: Actions = {
	resend: async (event) => {
		const { request } = event;
		const limited = await limitAuthForm(getDb(), event, '/send-verification-email');
		if (limited) return limited;
		const parsed = parseForm(emailOnlySchema, await request.formData());
		if (!parsed.ok) return fail(400, parsed);
		try {
			await auth().api.sendVerificationEmail({
				body: { email: parsed.data.email },
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

import { fail } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { getDb } from '$lib/server/db';
import { parseForm } from '$lib/schemas/form';
import { emailOnlySchema } from '$lib/schemas/account';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const { request } = event;
		const limited = await limitAuthForm(getDb(), event, '/request-password-reset');
		if (limited) return limited;
		const parsed = parseForm(emailOnlySchema, await request.formData());
		if (!parsed.ok) return fail(400, parsed);
		try {
			await auth().api.requestPasswordReset({
				body: { email: parsed.data.email, redirectTo: '/reset-password' },
				headers: request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		// Same answer whether or not the address has an account, so nobody can probe for accounts.
		return { sent: true };
	}
};

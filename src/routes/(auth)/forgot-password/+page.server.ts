import { fail } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { parseForm } from '$lib/schemas/form';
import { emailOnlySchema } from '$lib/schemas/account';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async ({ request }) => {
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

import { fail, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { getDb } from '$lib/server/db';
import { parseForm } from '$lib/schemas/form';
import { resetPasswordSchema } from '$lib/schemas/account';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ url }) => ({ token: url.searchParams.get('token') ?? '' });

export const actions: Actions = {
	default: async (event) => {
		const { request } = event;
		const limited = await limitAuthForm(getDb(), event, '/reset-password');
		if (limited) return limited;
		const parsed = parseForm(resetPasswordSchema, await request.formData());
		if (!parsed.ok) return fail(400, parsed);
		try {
			await auth().api.resetPassword({
				body: { token: parsed.data.token, newPassword: parsed.data.password },
				headers: request.headers
			});
		} catch (err) {
			return authFailure(err);
		}
		redirect(303, '/sign-in?reset=1');
	}
};

import { fail, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { getDb } from '$lib/server/db';
import { parseForm } from '$lib/schemas/form';
import { signUpSchema } from '$lib/schemas/account';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (locals.user) redirect(303, '/account');
};

export const actions: Actions = {
	default: async (event) => {
		const { request } = event;
		const limited = await limitAuthForm(getDb(), event, '/sign-up/email');
		if (limited) return limited;
		const parsed = parseForm(signUpSchema, await request.formData());
		if (!parsed.ok) return fail(400, parsed);
		const { name, email, password } = parsed.data;
		try {
			await auth().api.signUpEmail({ body: { name, email, password }, headers: request.headers });
		} catch (err) {
			return authFailure(err, { values: { name, email } });
		}
		redirect(303, `/verify-email?sent=${encodeURIComponent(email)}`);
	}
};

import { fail, redirect } from '@sveltejs/kit';
import { auth } from '$lib/server/auth';
import { authFailure } from '$lib/server/auth/errors';
import { limitAuthForm } from '$lib/server/auth/form-rate-limit';
import { getDb } from '$lib/server/db';
import { parseForm } from '$lib/schemas/form';
import { signUpSchema } from '$lib/schemas/account';
import { safeNext } from '$lib/safe-next';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	// Where to come back to after confirming the address (an invitation, say): only a path that
	// passed the one open-redirect rule travels on, into the confirmation link.
	return { next: safeNext(url.searchParams.get('next'), '') };
};

export const actions: Actions = {
	default: async (event) => {
		const { request } = event;
		const limited = await limitAuthForm(getDb(), event, '/sign-up/email');
		if (limited) return limited;
		const form = await request.formData();
		const parsed = parseForm(signUpSchema, form);
		if (!parsed.ok) return fail(400, parsed);
		const { name, email, password } = parsed.data;
		const next = safeNext(String(form.get('next') ?? ''), '');
		try {
			await auth().api.signUpEmail({
				body: { name, email, password, ...(next ? { callbackURL: next } : {}) },
				headers: request.headers
			});
		} catch (err) {
			return authFailure(err, { values: { name, email } });
		}
		redirect(
			303,
			`/verify-email?${new URLSearchParams({ sent: email, ...(next ? { next } : {}) })}`
		);
	}
};
